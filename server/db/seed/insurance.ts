// Demo policy terms: every insurer's portfolio gets a terms set whose version 1 covers each site
// (invented, illustrative terms), so the demo's first runs record them and the financial view has
// something to show.
import { asc, eq, inArray } from 'drizzle-orm'
import type { Database } from '../index'
import { organisations, policySiteTerms, policyTermsSets, policyTermsVersions, portfolios, portfolioSites, sites } from '../schema'
import type { Seeder } from './index'

/** Occurrence deductibles cycled over the sites, in the organisation's currency. */
const DEDUCTIBLES = [10_000, 25_000, 50_000]

async function seedInsurance(db: Database) {
  const insurers = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.kind, 'insurer'))
  if (!insurers.length) return
  const books = await db.select().from(portfolios).where(inArray(portfolios.organisationId, insurers.map(i => i.id))).orderBy(asc(portfolios.name))
  for (const book of books) {
    const members = await db.select({ id: sites.id, insuredValue: sites.insuredPropertyValue }).from(portfolioSites)
      .innerJoin(sites, eq(sites.id, portfolioSites.siteId)).where(eq(portfolioSites.portfolioId, book.id)).orderBy(asc(sites.externalId))
    if (!members.length) continue
    const [set] = await db.insert(policyTermsSets).values({ organisationId: book.organisationId, portfolioId: book.id, name: `${book.name} — property terms`, description: 'Demo terms (invented).' }).returning()
    const [version] = await db.insert(policyTermsVersions).values({ termsSetId: set!.id, version: 1, note: 'Demo terms' }).returning()
    await db.insert(policySiteTerms).values(members.map((s, i) => ({
      versionId: version!.id, siteId: s.id,
      occurrenceDeductible: DEDUCTIBLES[i % DEDUCTIBLES.length]!,
      occurrenceLimit: s.insuredValue && s.insuredValue > 0 ? s.insuredValue : null,
      aggregateDeductible: 0,
      aggregateLimit: s.insuredValue && s.insuredValue > 0 ? 2 * s.insuredValue : null,
      share: i % 4 === 3 ? 0.5 : 1,
    })))
  }
}

export const insuranceSeeder: Seeder = { name: 'insurance', run: seedInsurance }
