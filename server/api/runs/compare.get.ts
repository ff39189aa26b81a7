// GET /api/runs/compare?a=&b= — two succeeded runs of the same portfolio: totals, the change per site
// with whether it exceeds simulation noise (difference over its combined standard error), and the
// assumption values that differ.
import { z } from 'zod'
import { assumptionParameterMeta } from '~~/shared/engine/assumptions'
import { getPath } from '~~/shared/paths'
import { findVersion } from '~~/server/assumptions/versions'
import { findSucceededRun, portfolioResult, siteResults, type SiteResult } from '~~/server/results/queries'
import type { ResultFigures } from '~~/server/results/figures'
import type { ResultFigure } from '~~/shared/results/figure'
import { changeVersusNoise } from '~~/shared/results/noise'
import type { NoiseOptions } from '~~/shared/results/noise'

/** A run's totals as [estimate, 95 % low, 95 % high]. */
const triple = (f: ResultFigure) => [f.rate, f.lo, f.hi]
const totals = (f: ResultFigures) => ({ ignition: triple(f.ignition), sparking: triple(f.sparking), direct: triple(f.direct), eal: triple(f.expectedAnnualLoss) })

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
  // Same seed: streams coincide per site and tank (errors correlated, the combined SE is conservative);
  // same seed and inputs: the results are bit-identical by construction.
  const noise: NoiseOptions = { sharedSeed: runA.seed === runB.seed, sameInputsAndSeed: runA.inputHash === runB.inputHash }
  const side = (s: SiteResult | undefined) => s ? { ignition: s.figures.ignition.rate, ignitionSe: s.figures.ignition.se, eal: s.figures.expectedAnnualLoss.rate, ealSe: s.figures.expectedAnnualLoss.se } : null
  // The figure's estimate and standard error, as changeVersusNoise reads them.
  const noiseOf = (f: ResultFigure<number> | undefined) => f ? { value: f.rate, se: f.se } : null
  const change = (x: ResultFigure<number> | undefined, y: ResultFigure<number> | undefined) => changeVersusNoise(noiseOf(x), noiseOf(y), noise)
  const versus = (x: SiteResult | undefined, y: SiteResult | undefined) => ({
    ignition: change(x?.figures.ignition, y?.figures.ignition),
    eal: change(x?.figures.expectedAnnualLoss, y?.figures.expectedAnnualLoss),
  })
  const bySite = new Map(sb.map(s => [s.siteId, s]))
  const sites = sa.map((s) => {
    const other = bySite.get(s.siteId)
    return { siteId: s.siteId, name: s.facts.name, a: side(s), b: side(other), noise: versus(s, other) }
  })
  for (const s of sb) if (!sa.some(x => x.siteId === s.siteId)) sites.push({ siteId: s.siteId, name: s.facts.name, a: null, b: side(s), noise: versus(undefined, s) })
  const assumptionChanges = assumptionParameterMeta
    .map(m => ({ key: m.key, label: m.label, unit: m.unit, a: getPath(va?.version.parameters, m.key), b: getPath(vb?.version.parameters, m.key) }))
    .filter(r => JSON.stringify(r.a) !== JSON.stringify(r.b))
  const describe = (r: typeof runA, v: typeof va) => ({ id: r.id, mode: r.mode, seed: r.seed, finishedAt: r.finishedAt, assumptions: v ? `${v.set.name} v${v.version.version}` : '—', inputHash: r.inputHash })
  return {
    currency: member.currency,
    portfolioName: runA.portfolioName,
    runs: { a: describe(runA, va), b: describe(runB, vb) },
    totals: { a: pa && totals(pa.figures), b: pb && totals(pb.figures) },
    totalsNoise: pa && pb ? {
      ignition: change(pa.figures.ignition, pb.figures.ignition),
      sparking: change(pa.figures.sparking, pb.figures.sparking),
      direct: change(pa.figures.direct, pb.figures.direct),
      eal: change(pa.figures.expectedAnnualLoss, pb.figures.expectedAnnualLoss),
    } : null,
    noiseBasis: noise.sameInputsAndSeed ? 'same_inputs_and_seed' : noise.sharedSeed ? 'shared_seed' : 'independent',
    sites,
    assumptionChanges,
  }
})
