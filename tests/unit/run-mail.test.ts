import { describe, expect, it } from 'vitest'
import { runDescription, runEndedMessage } from '../../server/mail/templates'
import type { PortfolioResult } from '../../server/results/queries'
import type { runs } from '../../server/db/schema'

// An invented finished run (hand-written figures).
const run = {
  id: '00000000-0000-4000-8000-000000000001', organisationId: '00000000-0000-4000-8000-000000000002', portfolioId: '00000000-0000-4000-8000-000000000003',
  portfolioName: 'Harbour fleet', assumptionVersionId: '00000000-0000-4000-8000-000000000004', mode: 'year', seed: 42, targetRse: 0.02, maxSamplesPerTank: 1000,
  negligibleRatePerYear: 1e-5, years: 10_000, stormClustering: false, clusteringFrame: null, assumptionDraws: 0, chunkSize: 20, state: 'succeeded', sitesTotal: 3, sitesDone: 3, tanksTotal: 9, chunksTotal: 1, chunksDone: 1,
  inputHash: 'ab', engineVersion: '2.0.0', errorMessage: null, requestedBy: null, retryOf: null, name: 'Harbour fleet, 2026-03-14', isReference: false,
  createdAt: new Date('2026-03-14T09:00:00Z'), startedAt: new Date('2026-03-14T09:00:01Z'), finishedAt: new Date('2026-03-14T09:05:00Z'),
} satisfies typeof runs.$inferSelect
const figure = (rate: number) => ({ rate, lo: rate * 0.9, hi: rate * 1.1, se: rate * 0.05, count: null, upperBoundOnly: false })
const portfolio: PortfolioResult = {
  figures: { direct: figure(0.02), sparking: figure(0.5), ignition: figure(0.1), expectedAnnualLoss: figure(123_456) },
  lossSplit: { propertyDamage: 100_000, businessInterruption: 23_456 }, yearSummary: null, draws: null,
}

describe('the run-ended e-mail (one name per thing, issue #18)', () => {
  it('says "simulated years", never "year mode"', () => {
    expect(runDescription(run)).toBe('simulated-years run (10,000 years per site)')
    expect(runDescription({ ...run, mode: 'frequency' })).toBe('frequency run')
    const m = runEndedMessage({ run, recipientName: 'Ada', portfolio, currency: 'EUR' })
    expect(m.text).not.toMatch(/year-mode|year mode/)
    expect(m.text).toContain('the simulated-years run (10,000 years per site) of portfolio "Harbour fleet"')
  })

  it('shows money in the organisation\'s currency and names the average annual loss (AAL)', () => {
    const m = runEndedMessage({ run, recipientName: 'Ada', portfolio, currency: 'EUR' })
    // 123,456 written with thousands separators and the currency code (shared/format.ts formatMoney).
    expect(m.text).toContain('Average annual loss (AAL): EUR 123,456 per year')
    expect(m.text).not.toContain('USD')
    expect(m.text).toContain('not a lightning-protection design')
    expect(m.subject).toBe('Stormledger: run finished — Harbour fleet')
  })
})
