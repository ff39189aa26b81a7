// Command-line entry to the risk engine: reads a JSON document (one site or a list of sites, with an
// optional partial assumption set merged over the defaults) and prints JSON results.
//   npm run calc -- <input.json> [--mode frequency|year|quadrature] [--seed N] [--years N]
//                   [--target-rse X] [--max-samples N] [--negligible-rate X] [--draws K] [--events]
// --draws K (frequency mode): K draws of the assumption set's uncertainty; adds "assumptionDraws" (5/50/95 % bands, sensitivity).
// Frequency mode: a figure stopped by the negligible-rate rule carries "upperBoundOnly": true (its hi is an upper bound).
// The input format is documented in docs/engine.md (example: examples/site.json).
// Bad input: a message on stderr and exit code 2.
import { readFileSync } from 'node:fs'
import {
  DEFAULT_NEGLIGIBLE_RATE_PER_YEAR, ENGINE_VERSION, EngineInputError, isolatedTankQuadrature, parseAssumptions, parseSite, rollUpFrequency, rollUpYears,
  simulateSiteFrequency, simulateSiteYears,
} from '../shared/engine/index'
import type { AssumptionSet, SiteInput, SiteYearResult } from '../shared/engine/index'
import { evaluationCount, MAX_DRAWS, MIN_DRAWS, planAssumptionDraws } from '../shared/engine/draws'
import { bandOf, DRAW_METRICS, drawsOf, sensitivityOf, siteDrawValues, summariseSiteDraws, type DrawMetric } from '../shared/engine/draw-figures'

type Mode = 'frequency' | 'year' | 'quadrature'

interface Options { file: string; mode: Mode; seed: number; years: number; targetRse: number; maxSamples: number; negligibleRate: number; events: boolean; draws: number }

const USAGE = 'usage: calc <input.json> [--mode frequency|year|quadrature] [--seed N] [--years N] [--target-rse X] [--max-samples N] [--negligible-rate X] [--draws K] [--events]'

class UsageError extends Error {}

function parseArgs(argv: string[]): Options {
  const options: Options = { file: '', mode: 'frequency', seed: 1, years: 10_000, targetRse: 0.02, maxSamples: 400_000, negligibleRate: DEFAULT_NEGLIGIBLE_RATE_PER_YEAR, events: false, draws: 0 }
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!
    const value = () => {
      const v = argv[++i]
      if (v === undefined) throw new UsageError(`${arg} needs a value`)
      return v
    }
    switch (arg) {
      case '--mode': options.mode = parseMode(value()); break
      case '--seed': options.seed = parseNumber(arg, value(), (n) => Number.isInteger(n), 'a whole number'); break
      case '--years': options.years = parseNumber(arg, value(), (n) => Number.isInteger(n) && n >= 1 && n <= 10_000_000, 'a whole number from 1 to 10 000 000'); break
      case '--target-rse': options.targetRse = parseNumber(arg, value(), (n) => n > 0 && n < 1, 'a number between 0 and 1 (e.g. 0.02)'); break
      case '--max-samples': options.maxSamples = parseNumber(arg, value(), (n) => Number.isInteger(n) && n >= 1000, 'a whole number ≥ 1000'); break
      case '--negligible-rate': options.negligibleRate = parseNumber(arg, value(), (n) => n >= 0 && n <= 1e-3, 'a rate per year from 0 (off) to 0.001'); break
      case '--draws': options.draws = parseNumber(arg, value(), (n) => Number.isInteger(n) && n >= MIN_DRAWS && n <= MAX_DRAWS, `a whole number from ${MIN_DRAWS} to ${MAX_DRAWS}`); break
      case '--events': options.events = true; break
      case '--help': case '-h': throw new UsageError(USAGE)
      default:
        if (arg.startsWith('--')) throw new UsageError(`unknown option ${arg}\n${USAGE}`)
        if (options.file) throw new UsageError(`only one input file, got '${options.file}' and '${arg}'`)
        options.file = arg
    }
  }
  if (!options.file) throw new UsageError(`no input file\n${USAGE}`)
  return options
}

function parseMode(v: string): Mode {
  if (v === 'frequency' || v === 'year' || v === 'quadrature') return v
  throw new UsageError(`--mode must be frequency, year or quadrature, got '${v}'`)
}

function parseNumber(flag: string, text: string, ok: (n: number) => boolean, what: string): number {
  const n = Number(text)
  if (text.trim() === '' || !Number.isFinite(n) || !ok(n)) throw new UsageError(`${flag} must be ${what}, got '${text}'`)
  return n
}

interface Document { sites: SiteInput[]; assumptions: AssumptionSet }

/** Accepts { site, assumptions }, { sites, assumptions }, a bare site, or a list of sites. */
function readDocument(file: string): Document {
  let text: string
  try { text = readFileSync(file, 'utf8') } catch (e) { throw new UsageError(`cannot read ${file}: ${(e as Error).message}`) }
  let doc: unknown
  try { doc = JSON.parse(text) } catch (e) { throw new UsageError(`${file} is not valid JSON: ${(e as Error).message}`) }
  const record = typeof doc === 'object' && doc !== null && !Array.isArray(doc) ? doc as Record<string, unknown> : null
  const rawSites = Array.isArray(doc) ? doc : record && 'sites' in record ? record.sites : record && 'site' in record ? [record.site] : record && 'tanks' in record ? [record] : null
  if (!Array.isArray(rawSites) || rawSites.length === 0) {
    throw new UsageError(`${file}: expected { "site": {…} }, { "sites": [ … ] }, a site, or a list of sites (see docs/engine.md)`)
  }
  const assumptions = withPrefix('assumptions', () => parseAssumptions(record && 'assumptions' in record ? record.assumptions : {}))
  const sites = rawSites.map((s, i) => withPrefix(`sites[${i}]`, () => parseSite(s)))
  const ids = new Set<string>()
  for (const s of sites) {
    if (ids.has(s.id)) throw new EngineInputError('Invalid input', [`site id '${s.id}' appears twice (each site's random streams derive from its id)`])
    ids.add(s.id)
  }
  return { sites, assumptions }
}

function withPrefix<T>(prefix: string, f: () => T): T {
  try { return f() } catch (e) {
    if (e instanceof EngineInputError) throw new EngineInputError(`Invalid input in ${prefix}`, e.issues)
    throw e
  }
}

function yearSiteJson(r: SiteYearResult, withEvents: boolean) {
  const { yearLosses, yearMaxEventLoss, events, ...rest } = r
  if (!withEvents) return { ...rest, eventCount: events.year.length }
  return {
    ...rest,
    yearLosses: Array.from(yearLosses),
    yearMaxEventLoss: Array.from(yearMaxEventLoss),
    events: Array.from(events.year, (year, e) => ({
      year, loss: events.loss[e]!,
      tanks: Array.from({ length: events.tankCount[e]! }, (_, k) => {
        const at = events.tankStart[e]! + k
        return { tankId: r.tanks[events.tankIndex[at]!]!.tankId, loss: events.tankLoss[at]! }
      }),
    })),
  }
}

/**
 * Assumption draws (frequency mode): per tank, site and portfolio the 5/50/95 % points across K
 * draws of the uncertain assumptions, and the sensitivity indices (shared/engine/draw-figures.ts).
 */
function assumptionDraws(sites: SiteInput[], assumptions: AssumptionSet, results: ReturnType<typeof simulateSiteFrequency>[], o: Options) {
  if (o.mode !== 'frequency') throw new UsageError('--draws works with --mode frequency only')
  const plan = planAssumptionDraws(assumptions, { draws: o.draws, runSeed: o.seed })
  const sums = Object.fromEntries(DRAW_METRICS.map((m) => [m, new Float64Array(evaluationCount(plan))])) as Record<DrawMetric, Float64Array>
  const perSite = sites.map((site, i) => {
    const central = results[i]!.tanks.map((t) => ({ direct: t.direct.rate, sparking: t.sparking.rate, ignition: t.ignition.rate, expectedAnnualLoss: t.expectedAnnualLoss.rate }))
    const s = summariseSiteDraws(siteDrawValues(site, plan, { runSeed: o.seed }), central, plan, `${o.seed}|${site.id}`)
    for (const m of DRAW_METRICS) s.series[m].forEach((v, e) => { sums[m][e]! += v })
    return { siteId: site.id, bands: s.site, sensitivity: s.sensitivity, tanks: s.tanks.map((bands, t) => ({ tankId: site.tanks[t]!.id, bands })) }
  })
  return {
    draws: o.draws, factors: plan.factors.map((f) => f.path), clampedDamageRatioSd: plan.clamped,
    portfolio: {
      bands: Object.fromEntries(DRAW_METRICS.map((m) => [m, bandOf(drawsOf(sums[m], o.draws))])),
      sensitivity: [sensitivityOf(sums.ignition, plan, 'expectedFires', `${o.seed}|portfolio`), sensitivityOf(sums.expectedAnnualLoss, plan, 'aal', `${o.seed}|portfolio`)],
    },
    sites: perSite,
  }
}

function run(o: Options): unknown {
  const { sites, assumptions } = readDocument(o.file)
  const header = { engineVersion: ENGINE_VERSION, mode: o.mode, runSeed: o.seed, assumptions }
  if (o.mode === 'frequency') {
    const results = sites.map((s) => simulateSiteFrequency(s, assumptions, { runSeed: o.seed, targetRse: o.targetRse, maxSamplesPerTank: o.maxSamples, negligibleRatePerYear: o.negligibleRate }))
    const out = { ...header, targetRse: o.targetRse, negligibleRatePerYear: o.negligibleRate, sites: results, portfolio: rollUpFrequency(results) }
    return o.draws > 0 ? { ...out, assumptionDraws: assumptionDraws(sites, assumptions, results, o) } : out
  }
  if (o.mode === 'year') {
    const results = sites.map((s) => simulateSiteYears(s, assumptions, { runSeed: o.seed, years: o.years }))
    const { summary } = rollUpYears(results)
    return { ...header, years: o.years, sites: results.map((r) => yearSiteJson(r, o.events)), portfolio: { summary } }
  }
  return {
    ...header,
    note: 'each tank taken alone (no neighbours, no structures): MODEL.md §6',
    sites: sites.map((s) => ({ siteId: s.id, tanks: s.tanks.map((t) => ({ tankId: t.id, tag: t.tag, ...isolatedTankQuadrature(t, s.flashDensity, assumptions) })) })),
  }
}

function main(): number {
  try {
    const output = run(parseArgs(process.argv.slice(2)))
    process.stdout.write(`${JSON.stringify(output, null, 2)}\n`)
    return 0
  } catch (e) {
    if (e instanceof UsageError) { process.stderr.write(`calc: ${e.message}\n`); return 2 }
    if (e instanceof EngineInputError) { process.stderr.write(`calc: ${e.message}\n`); return 2 }
    process.stderr.write(`calc: unexpected failure: ${e instanceof Error ? e.stack ?? e.message : String(e)}\n`)
    return 1
  }
}

process.exitCode = main()
