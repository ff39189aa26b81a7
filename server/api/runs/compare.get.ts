// GET /api/runs/compare?a=&b= — two succeeded runs of the same portfolio: totals, the change per site,
// and the assumption values that differ.
import { z } from 'zod'
import { assumptionParameterMeta } from '~~/shared/engine/assumptions'
import { getPath } from '~~/shared/paths'
import { findVersion } from '~~/server/assumptions/versions'
import { findSucceededRun, portfolioResult, siteResults } from '~~/server/results/queries'

const query = z.object({ a: z.uuid('Choose the first run.'), b: z.uuid('Choose the second run.') })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { a, b } = readValidQuery(event, query)
  const [runA, runB] = await Promise.all([findSucceededRun(member.organisationId, a), findSucceededRun(member.organisationId, b)])
  if (!runA || !runB) notFound('Results of one of the runs')
  if (runA.portfolioId !== runB.portfolioId) badRequest('The two runs cover different portfolios; compare runs of the same portfolio.')
  const [pa, pb, sa, sb, va, vb] = await Promise.all([
    portfolioResult(a), portfolioResult(b), siteResults(a), siteResults(b),
    findVersion(member.organisationId, runA.assumptionVersionId), findVersion(member.organisationId, runB.assumptionVersionId),
  ])
  const bySite = new Map(sb.map(s => [s.siteId, s]))
  const sites = sa.map(s => {
    const other = bySite.get(s.siteId)
    return {
      siteId: s.siteId, name: s.facts.name,
      a: { ignition: s.ignitionRate, eal: s.expectedAnnualLoss },
      b: other ? { ignition: other.ignitionRate, eal: other.expectedAnnualLoss } : null,
    }
  })
  for (const s of sb) if (!sa.some(x => x.siteId === s.siteId)) sites.push({ siteId: s.siteId, name: s.facts.name, a: null as never, b: { ignition: s.ignitionRate, eal: s.expectedAnnualLoss } })
  const assumptionChanges = assumptionParameterMeta
    .map(m => ({ key: m.key, label: m.label, unit: m.unit, a: getPath(va?.version.parameters, m.key), b: getPath(vb?.version.parameters, m.key) }))
    .filter(r => JSON.stringify(r.a) !== JSON.stringify(r.b))
  const describe = (r: typeof runA, v: typeof va) => ({ id: r.id, mode: r.mode, seed: r.seed, finishedAt: r.finishedAt, assumptions: v ? `${v.set.name} v${v.version.version}` : '—', inputHash: r.inputHash })
  return {
    currency: member.currency,
    portfolioName: runA.portfolioName,
    runs: { a: describe(runA, va), b: describe(runB, vb) },
    totals: {
      a: pa && { ignition: [pa.ignitionRate, pa.ignitionLo, pa.ignitionHi], sparking: [pa.sparkingRate, pa.sparkingLo, pa.sparkingHi], direct: [pa.directRate, pa.directLo, pa.directHi], eal: [pa.expectedAnnualLoss, pa.expectedAnnualLossLo, pa.expectedAnnualLossHi] },
      b: pb && { ignition: [pb.ignitionRate, pb.ignitionLo, pb.ignitionHi], sparking: [pb.sparkingRate, pb.sparkingLo, pb.sparkingHi], direct: [pb.directRate, pb.directLo, pb.directHi], eal: [pb.expectedAnnualLoss, pb.expectedAnnualLossLo, pb.expectedAnnualLossHi] },
    },
    sites,
    assumptionChanges,
  }
})
