// Which run the overview opens (issue "Screens a practitioner reads at a glance": the reference run
// of the chosen portfolio, not whichever run finished last anywhere). Expected values hand-worked
// from the rows below.
import { describe, expect, it } from 'vitest'
import { overviewChoice, overviewPortfolios, type OverviewRun } from '../../shared/results/overview'

const run = (id: string, portfolioId: string, finishedAt: string, o: Partial<OverviewRun> = {}): OverviewRun =>
  ({ id, state: 'succeeded', portfolioId, portfolioName: portfolioId === 'p-north' ? 'North fleet' : 'South fleet', isReference: false, finishedAt, ...o })

const runs: OverviewRun[] = [
  run('n-old', 'p-north', '2026-01-01T00:00:00Z', { isReference: true }),
  run('n-new', 'p-north', '2026-02-01T00:00:00Z'),
  run('n-failed', 'p-north', '2026-03-01T00:00:00Z', { state: 'failed' }),
  run('s-newest', 'p-south', '2026-04-01T00:00:00Z'),
]

describe('overview run choice', () => {
  it('opens the reference run, not the run that finished last anywhere', () => {
    // s-newest finished last, but South has no reference and North (first by name) has one: n-old.
    expect(overviewChoice(runs)).toEqual({ portfolioId: 'p-north', runId: 'n-old' })
  })

  it('a chosen portfolio without a reference opens its newest finished run', () => {
    expect(overviewChoice(runs, { portfolioId: 'p-south' })).toEqual({ portfolioId: 'p-south', runId: 's-newest' })
  })

  it('keeps a chosen run of the chosen portfolio, and ignores one of another portfolio or a failed one', () => {
    expect(overviewChoice(runs, { portfolioId: 'p-north', runId: 'n-new' })).toEqual({ portfolioId: 'p-north', runId: 'n-new' })
    expect(overviewChoice(runs, { portfolioId: 'p-north', runId: 's-newest' })).toEqual({ portfolioId: 'p-north', runId: 'n-old' })
    expect(overviewChoice(runs, { runId: 'n-failed' })).toEqual({ portfolioId: 'p-north', runId: 'n-old' })
    // A run alone (an old link ?run=) opens its own portfolio.
    expect(overviewChoice(runs, { runId: 's-newest' })).toEqual({ portfolioId: 'p-south', runId: 's-newest' })
  })

  it('lists portfolios with finished runs by name, runs newest first, and nothing without a finished run', () => {
    expect(overviewPortfolios(runs).map(p => [p.name, p.referenceRunId, p.runIds])).toEqual([
      ['North fleet', 'n-old', ['n-new', 'n-old']],
      ['South fleet', null, ['s-newest']],
    ])
    expect(overviewChoice([run('x', 'p-north', '2026-01-01T00:00:00Z', { state: 'running' })])).toBeNull()
  })
})
