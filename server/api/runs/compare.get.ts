// GET /api/runs/compare?a=&b= — two succeeded runs of the same portfolio: totals, the change per site
// with whether it exceeds simulation noise (difference over its combined standard error), and the
// assumption values that differ.
import { z } from 'zod'
import { assumptionParameterMeta } from '~~/shared/engine/assumptions'
import { getPath } from '~~/shared/paths'
import { findVersion } from '~~/server/assumptions/versions'
import { findSucceededRun, portfolioResult, siteResults } from '~~/server/results/queries'
import { changeVersusNoise } from '~~/shared/results/noise'
import type { NoiseOptions } from '~~/shared/results/noise'

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
  type SiteRow = (typeof sa)[number]
  const side = (s: SiteRow | undefined) => s ? { ignition: s.ignitionRate, ignitionSe: s.ignitionSe, eal: s.expectedAnnualLoss, ealSe: s.expectedAnnualLossSe } : null
  const versus = (x: SiteRow | undefined, y: SiteRow | undefined) => ({
    ignition: changeVersusNoise(x ? { value: x.ignitionRate, se: x.ignitionSe } : null, y ? { value: y.ignitionRate, se: y.ignitionSe } : null, noise),
    eal: changeVersusNoise(x ? { value: x.expectedAnnualLoss, se: x.expectedAnnualLossSe } : null, y ? { value: y.expectedAnnualLoss, se: y.expectedAnnualLossSe } : null, noise),
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
    totals: {
      a: pa && { ignition: [pa.ignitionRate, pa.ignitionLo, pa.ignitionHi], sparking: [pa.sparkingRate, pa.sparkingLo, pa.sparkingHi], direct: [pa.directRate, pa.directLo, pa.directHi], eal: [pa.expectedAnnualLoss, pa.expectedAnnualLossLo, pa.expectedAnnualLossHi] },
      b: pb && { ignition: [pb.ignitionRate, pb.ignitionLo, pb.ignitionHi], sparking: [pb.sparkingRate, pb.sparkingLo, pb.sparkingHi], direct: [pb.directRate, pb.directLo, pb.directHi], eal: [pb.expectedAnnualLoss, pb.expectedAnnualLossLo, pb.expectedAnnualLossHi] },
    },
    totalsNoise: pa && pb ? {
      ignition: changeVersusNoise({ value: pa.ignitionRate, se: pa.ignitionSe }, { value: pb.ignitionRate, se: pb.ignitionSe }, noise),
      sparking: changeVersusNoise({ value: pa.sparkingRate, se: pa.sparkingSe }, { value: pb.sparkingRate, se: pb.sparkingSe }, noise),
      direct: changeVersusNoise({ value: pa.directRate, se: pa.directSe }, { value: pb.directRate, se: pb.directSe }, noise),
      eal: changeVersusNoise({ value: pa.expectedAnnualLoss, se: pa.expectedAnnualLossSe }, { value: pb.expectedAnnualLoss, se: pb.expectedAnnualLossSe }, noise),
    } : null,
    noiseBasis: noise.sameInputsAndSeed ? 'same_inputs_and_seed' : noise.sharedSeed ? 'shared_seed' : 'independent',
    sites,
    assumptionChanges,
  }
})
