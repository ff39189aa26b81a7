// Year mode (MODEL.md §5): simulated years per site. Flashes that can matter are drawn from the
// thinning envelope; each kept flash strikes or sparks one or several tanks of the site at once,
// each event may ignite, and each ignition costs the tank's severity × a damage factor.
import type { CountEstimate, SiteInput } from './types'
import type { AssumptionSet } from './assumptions'
import type { PreparedSite } from './kernel'
import type { Candidate, Envelope } from './envelope'
import type { UniformStream } from './random'
import type { YearLossSummary } from './exceedance'
import { attachFlash, prepareSite, siteEventProbabilities, strikeRadius } from './kernel'
import { buildEnvelope, cellBoundOf, drawCandidate } from './envelope'
import { createStream, poissonDraw } from './random'
import { normalQuantile } from './normal'
import { damageFactor } from './ignition'
import { countEstimate } from './statistics'
import { siteRadius } from './reach'
import { flashesPerYearOnDisc } from './flash-density'
import { summariseYearLosses } from './exceedance'

export interface YearOptions { runSeed: number | string; years: number }

/**
 * Loss events (flashes that ignited at least one tank), sorted by year. Event e involves the tanks
 * tankIndex[tankStart[e] … tankStart[e+1]) (indices into the site's tanks) with their own losses
 * in tankLoss — kept so insurance terms can be applied per tank, per event or per year later.
 */
export interface YearEventTable {
  year: Int32Array
  loss: Float64Array
  tankCount: Int32Array
  tankStart: Int32Array
  tankIndex: Int32Array
  tankLoss: Float64Array
}

export interface TankYearResult {
  tankId: string
  tag: string
  direct: CountEstimate
  sparking: CountEstimate
  ignition: CountEstimate
  averageAnnualLoss: { mean: number; se: number }
}

export interface SiteYearResult {
  siteId: string
  mode: 'year'
  attachmentModel: PreparedSite['attachmentModel']
  years: number
  radiusM: number
  lambdaPerYear: number
  /** Candidate flashes per year drawn from the envelope, and how many were simulated and kept. */
  candidateRatePerYear: number
  candidates: number
  eventFlashes: number
  /** Aggregate loss per simulated year (typed array; year index shared across sites of a run). */
  yearLosses: Float64Array
  /** Largest single-event loss per year (for the occurrence exceedance curve). */
  yearMaxEventLoss: Float64Array
  events: YearEventTable
  tanks: TankYearResult[]
  /** Tank events of the site (a flash that strikes or sparks two tanks counts twice), Garwood intervals. */
  totals: { direct: CountEstimate; sparking: CountEstimate; ignition: CountEstimate }
  summary: YearLossSummary
}

interface Tally {
  direct: Float64Array; sparking: Float64Array; ignition: Float64Array
  eventYear: number[]; eventLoss: number[]; eventTankStart: number[]; eventTankIndex: number[]; eventTankLoss: number[]
}

/** Simulate `years` years for one site. Deterministic in (site, assumptions, runSeed, years). */
export function simulateSiteYears(site: SiteInput, assumptions: AssumptionSet, options: YearOptions): SiteYearResult {
  if (!Number.isInteger(options.years) || options.years < 1) throw new RangeError(`years must be a whole number ≥ 1, got ${options.years}`)
  const ps = prepareSite(site, assumptions)
  const env = buildEnvelope(ps)
  const rand = createStream(options.runSeed, site.id, 'years')
  const years = options.years
  const tally: Tally = {
    direct: new Float64Array(ps.nTanks), sparking: new Float64Array(ps.nTanks), ignition: new Float64Array(ps.nTanks),
    eventYear: [], eventLoss: [], eventTankStart: [], eventTankIndex: [], eventTankLoss: [],
  }
  // Conditional on their total, the candidates of a Poisson process over Y years fall in
  // independent uniform years: one Poisson draw instead of one per year.
  const candidates = poissonDraw(env.totalRate * years, rand)
  const flash: Candidate = { x: 0, y: 0, currentKa: 0, lnI: 0, cell: 0 }
  const probability = new Float64Array(ps.nTanks)
  const none = new Float64Array(ps.nTanks + 1)
  const hit = new Uint8Array(ps.nTanks)
  let eventFlashes = 0
  for (let c = 0; c < candidates; c++) {
    const year = Math.min(years - 1, Math.floor(rand() * years))
    drawCandidate(ps, env, rand, flash)
    const attached = attachFlash(ps, flash.x, flash.y, strikeRadius(ps, flash.lnI))
    const anyEvent = 1 - siteEventProbabilities(ps, flash.currentKa, flash.lnI, attached, flash.x, flash.y, probability)
    if (rand() * cellBoundOf(env, flash.cell) >= anyEvent) continue
    eventFlashes += 1
    drawOutcome(ps.nTanks, probability, none, rand, hit)
    recordFlash(ps, attached, hit, year, rand, tally)
  }
  return siteYearResult(ps, env, years, candidates, eventFlashes, tally)
}

/**
 * Which tanks have an event, given that at least one has: the first tank with an event is drawn
 * with P(t first | some event among t…n) = p_t / (1 − Π_{l ≥ t}(1 − p_l)), the rest independently.
 * `none[t]` holds Π_{l ≥ t}(1 − p_l).
 */
function drawOutcome(n: number, p: Float64Array, none: Float64Array, rand: UniformStream, hit: Uint8Array): void {
  none[n] = 1
  for (let t = n - 1; t >= 0; t--) none[t] = none[t + 1]! * (1 - p[t]!)
  let found = false
  for (let t = 0; t < n; t++) {
    const pt = p[t]!
    if (found) { hit[t] = rand() < pt ? 1 : 0; continue }
    const anyFromHere = 1 - none[t]!
    hit[t] = anyFromHere > 0 && rand() * anyFromHere < pt ? 1 : 0
    if (hit[t] === 1) found = true
  }
}

/** Count the flash's strikes and sparks, draw ignitions and damage, and record a loss event. */
function recordFlash(ps: PreparedSite, attached: number, hit: Uint8Array, year: number, rand: UniformStream, tally: Tally): void {
  let eventLoss = 0
  let started = false
  for (let t = 0; t < ps.nTanks; t++) {
    if (hit[t] !== 1) continue
    const direct = attached === t
    if (direct) tally.direct[t]! += 1
    else tally.sparking[t]! += 1
    if (rand() >= (direct ? ps.pIgnDirect[t]! : ps.pIgnSpark[t]!)) continue
    tally.ignition[t]! += 1
    const loss = ps.severity[t]! * damageFactor(normalQuantile(rand()), ps.damageSigma)
    if (!started) { tally.eventTankStart.push(tally.eventTankIndex.length); started = true }
    tally.eventTankIndex.push(t)
    tally.eventTankLoss.push(loss)
    eventLoss += loss
  }
  if (started) { tally.eventYear.push(year); tally.eventLoss.push(eventLoss) }
}

function siteYearResult(ps: PreparedSite, env: Envelope, years: number, candidates: number, eventFlashes: number, tally: Tally): SiteYearResult {
  const events = sortedEvents(tally, years)
  const yearLosses = new Float64Array(years)
  const yearMaxEventLoss = new Float64Array(years)
  for (let e = 0; e < events.year.length; e++) {
    const y = events.year[e]!
    yearLosses[y]! += events.loss[e]!
    if (events.loss[e]! > yearMaxEventLoss[y]!) yearMaxEventLoss[y] = events.loss[e]!
  }
  const radiusM = siteRadius(ps)
  const annualLosses = tankAnnualLosses(events, ps.nTanks, years)
  return {
    siteId: ps.siteId, mode: 'year', attachmentModel: ps.attachmentModel, years, radiusM,
    lambdaPerYear: flashesPerYearOnDisc(ps.flashDensity, radiusM),
    candidateRatePerYear: env.totalRate, candidates, eventFlashes,
    yearLosses, yearMaxEventLoss, events,
    tanks: ps.tanks.map((tank, t) => ({
      tankId: tank.id, tag: tank.tag,
      direct: countEstimate(tally.direct[t]!, years),
      sparking: countEstimate(tally.sparking[t]!, years),
      ignition: countEstimate(tally.ignition[t]!, years),
      averageAnnualLoss: annualLosses[t]!,
    })),
    totals: {
      direct: countEstimate(sum(tally.direct), years),
      sparking: countEstimate(sum(tally.sparking), years),
      ignition: countEstimate(sum(tally.ignition), years),
    },
    summary: summariseYearLosses(yearLosses, yearMaxEventLoss),
  }
}

function sum(values: Float64Array): number {
  let total = 0
  for (let i = 0; i < values.length; i++) total += values[i]!
  return total
}

/** Events in year order (ties keep simulation order: a stable counting sort on the year), with their tank lists. */
function sortedEvents(tally: Tally, years: number): YearEventTable {
  const n = tally.eventYear.length
  const firstOfYear = new Int32Array(years + 1)
  for (let e = 0; e < n; e++) firstOfYear[tally.eventYear[e]! + 1]! += 1
  for (let y = 0; y < years; y++) firstOfYear[y + 1]! += firstOfYear[y]!
  const order = new Int32Array(n)
  for (let e = 0; e < n; e++) order[firstOfYear[tally.eventYear[e]!]!++] = e
  const starts = tally.eventTankStart
  const tankTotal = tally.eventTankIndex.length
  const table: YearEventTable = {
    year: new Int32Array(n), loss: new Float64Array(n), tankCount: new Int32Array(n), tankStart: new Int32Array(n + 1),
    tankIndex: new Int32Array(tankTotal), tankLoss: new Float64Array(tankTotal),
  }
  let cursor = 0
  for (let rank = 0; rank < n; rank++) {
    const e = order[rank]!
    table.year[rank] = tally.eventYear[e]!
    table.loss[rank] = tally.eventLoss[e]!
    table.tankStart[rank] = cursor
    const end = e + 1 < n ? starts[e + 1]! : tankTotal
    for (let k = starts[e]!; k < end; k++) {
      table.tankIndex[cursor] = tally.eventTankIndex[k]!
      table.tankLoss[cursor] = tally.eventTankLoss[k]!
      cursor += 1
    }
    table.tankCount[rank] = cursor - table.tankStart[rank]!
  }
  table.tankStart[n] = cursor
  return table
}

/** Every tank's average annual loss and its standard error over the simulated years, in one pass over the events. */
function tankAnnualLosses(events: YearEventTable, nTanks: number, years: number): { mean: number; se: number }[] {
  const sum = new Float64Array(nTanks)
  const sum2 = new Float64Array(nTanks)
  const lastYear = new Int32Array(nTanks).fill(-1)
  const yearSum = new Float64Array(nTanks)
  for (let e = 0; e < events.year.length; e++) {
    const year = events.year[e]!
    for (let k = events.tankStart[e]!; k < events.tankStart[e + 1]!; k++) {
      const t = events.tankIndex[k]!
      // Events are in year order: a new year closes the tank's previous year.
      if (lastYear[t] !== year) { sum2[t]! += yearSum[t]! * yearSum[t]!; yearSum[t] = 0; lastYear[t] = year }
      yearSum[t]! += events.tankLoss[k]!
      sum[t]! += events.tankLoss[k]!
    }
  }
  return Array.from({ length: nTanks }, (_, t) => {
    const s2 = sum2[t]! + yearSum[t]! * yearSum[t]!
    const mean = sum[t]! / years
    const variance = years > 1 ? Math.max(0, (s2 - years * mean * mean) / (years - 1)) : 0
    return { mean, se: Math.sqrt(variance / years) }
  })
}
