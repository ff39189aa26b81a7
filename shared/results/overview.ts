// Which run the overview opens: the chosen portfolio's reference run (an analyst marks one per
// portfolio), else that portfolio's newest finished run — never simply whichever run finished last
// anywhere in the organisation. Pure: the page passes the runs list.

export interface OverviewRun {
  id: string
  state: string
  portfolioId: string
  portfolioName: string
  isReference: boolean
  finishedAt: string | Date | null
}

export interface OverviewPortfolio { id: string, name: string, referenceRunId: string | null, runIds: string[] }

const time = (v: string | Date | null) => (v ? new Date(v).getTime() : 0)

/** Portfolios with at least one finished run, by name; each with its finished runs, newest first. */
export function overviewPortfolios(runs: readonly OverviewRun[]): OverviewPortfolio[] {
  const byId = new Map<string, OverviewPortfolio & { finished: OverviewRun[] }>()
  for (const r of runs) {
    if (r.state !== 'succeeded') continue
    const p = byId.get(r.portfolioId) ?? { id: r.portfolioId, name: r.portfolioName, referenceRunId: null, runIds: [], finished: [] }
    p.finished.push(r)
    if (r.isReference) p.referenceRunId = r.id
    byId.set(r.portfolioId, p)
  }
  return [...byId.values()]
    .map(({ finished, ...p }) => ({ ...p, runIds: finished.sort((a, b) => time(b.finishedAt) - time(a.finishedAt)).map(r => r.id) }))
    .sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id))
}

/**
 * The portfolio and run to show. A portfolio asked for (that has a finished run) wins, else the first
 * portfolio by name that has a reference run, else the first portfolio; a run asked for is kept when it
 * belongs to that portfolio, else its reference run, else its newest finished run.
 */
export function overviewChoice(runs: readonly OverviewRun[], asked: { portfolioId?: string, runId?: string } = {}): { portfolioId: string, runId: string } | null {
  const portfolios = overviewPortfolios(runs)
  const askedRun = asked.runId ? runs.find(r => r.id === asked.runId && r.state === 'succeeded') : undefined
  const portfolio = portfolios.find(p => p.id === asked.portfolioId)
    ?? (askedRun && !asked.portfolioId ? portfolios.find(p => p.id === askedRun.portfolioId) : undefined)
    ?? portfolios.find(p => p.referenceRunId)
    ?? portfolios[0]
  if (!portfolio) return null
  const runId = askedRun && askedRun.portfolioId === portfolio.id ? askedRun.id : portfolio.referenceRunId ?? portfolio.runIds[0]!
  return { portfolioId: portfolio.id, runId }
}
