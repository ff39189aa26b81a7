// Interval coverage of frequency mode on shadowed layouts (issue 15). Prints, per tank and figure
// ≥ 1e-6 /yr: the reference, the share of seeds whose 95 % interval holds it, and the seed-to-seed
// spread over the mean reported standard error. Run with `npm run bench:coverage`
// (options: --seeds N (default 100), --target X (default 0.02; repeat for several), --per-cell N).
import { parseAssumptions } from '../shared/engine/assumptions'
import { ENGINE_VERSION } from '../shared/engine/index'
import { coverageOfLayout, layoutReferences, SHADOWED_LAYOUTS } from './coverage-layouts'

function option(name: string, fallback: number): number[] {
  const values: number[] = []
  process.argv.forEach((arg, i) => { if (arg === `--${name}`) values.push(Number(process.argv[i + 1])) })
  return values.length > 0 ? values : [fallback]
}

const seeds = option('seeds', 100)[0]!
const targets = option('target', 0.02)
const perCell = option('per-cell', 4000)[0]!
const a = parseAssumptions({})
const sci = (x: number) => x.toExponential(3)

console.log(`engine ${ENGINE_VERSION}; ${seeds} seeds per layout; reference: quadrature (direct), fixed-allocation stratified Monte Carlo with ${perCell} draws per cell (sparking)`)
let worstCoverage = 1
let worstRatio = 0
let worstReference = 0
for (const site of SHADOWED_LAYOUTS) {
  const t0 = performance.now()
  const refs = layoutReferences(site, a, perCell)
  console.log(`\n${site.name} (${site.id}); references in ${((performance.now() - t0) / 1000).toFixed(1)} s`)
  for (const r of refs) {
    const z = r.directBruteForce.se > 0 ? (r.direct.value - r.directBruteForce.value) / r.directBruteForce.se : 0
    console.log(`  ${r.tankId}: direct by quadrature ${sci(r.direct.value)} /yr vs brute force ${sci(r.directBruteForce.value)} ± ${sci(r.directBruteForce.se)} /yr (z = ${z.toFixed(2)})`)
  }
  for (const target of targets) {
    const t1 = performance.now()
    const rows = coverageOfLayout(site, a, refs, seeds, target)
    console.log(`  target RSE ${target} (${((performance.now() - t1) / 1000).toFixed(1)} s for ${seeds} runs)`)
    console.log(`  ${'tank'.padEnd(5)} ${'figure'.padEnd(9)} ${'reference /yr'.padStart(13)} ${'ref SE/SE'.padStart(9)} ${'mean est /yr'.padStart(13)} ${'mean SE /yr'.padStart(12)} ${'coverage'.padStart(8)} ${'spread/SE'.padStart(9)} ${'rms z'.padStart(6)}`)
    for (const row of rows) {
      worstCoverage = Math.min(worstCoverage, row.coverage)
      worstRatio = Math.max(worstRatio, row.spreadOverSe)
      worstReference = Math.max(worstReference, row.referenceSeRatio)
      console.log(`  ${row.tankId.padEnd(5)} ${row.figure.padEnd(9)} ${sci(row.reference.value).padStart(13)} ${row.referenceSeRatio.toFixed(3).padStart(9)} ${sci(row.meanEstimate).padStart(13)} ${sci(row.meanSe).padStart(12)} ${`${(100 * row.coverage).toFixed(0)} %`.padStart(8)} ${row.spreadOverSe.toFixed(2).padStart(9)} ${row.rmsZ.toFixed(2).padStart(6)}`)
    }
  }
}
console.log(`\nworst coverage ${(100 * worstCoverage).toFixed(0)} % (target ≥ 90 %), worst spread/SE ${worstRatio.toFixed(2)} (target ≤ 1.25), worst reference SE / mean SE ${worstReference.toFixed(3)} (must be ≤ 0.1)`)
