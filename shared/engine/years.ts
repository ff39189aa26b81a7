// Year mode (MODEL.md §5): simulated years per site. Flashes that can matter are drawn from the
// thinning envelope; each kept flash strikes or sparks one or several tanks of the site at once,
// each event may ignite, each ignition costs every loss component its value × a damage ratio on
// [0, 1], and a fire may spread to neighbouring tanks (loss.ts).
import type { CountEstimate, SiteInput } from './types'
import type { AssumptionSet } from './assumptions'
import type { PreparedSite } from './kernel'
import type { Candidate, Envelope } from './envelope'
import type { UniformStream } from './random'
import type { YearLossSummary } from './exceedance'
import { attachFlash, siteEventProbabilities, strikeRadius } from './kernel'
import { cellBoundOf, drawCandidate } from './envelope'
import type { SitePreparation } from './prepared'
import { prepareSiteOnce } from './prepared'
import { createStream, poissonDraw } from './random'
import { burningTankLoss, type SpreadTable } from './loss'
import { countEstimate } from './statistics'
import { siteRadius } from './reach'
import { flashesPerYearOnDisc } from './flash-density'
import { summariseYearLosses } from './exceedance'
import { clusteredCandidateYears, type SiteClustering } from './storm-clusters'

export interface YearOptions {
  runSeed: number | string
  years: number
  /** Storm clustering (storm-clusters.ts): the site's place in the run's storm field; absent or null: independent years. */
  clustering?: SiteClustering | null
}

/**
 * Loss events (flashes that ignited at least one tank), sorted by year. Event e involves the tanks
 * tankIndex[tankStart[e] … tankStart[e+1]) (indices into the site's tanks) with their own losses
 * in tankLoss — kept so insurance terms can be applied per tank, per event or per year later.
 */
export interface YearEventTable {
  year: Int32Array
  /** Event loss = property damage + business interruption, over every tank that burned. */
  loss: Float64Array
  propertyDamage: Float64Array
  businessInterruption: Float64Array
  tankCount: Int32Array
  tankStart: Int32Array
  tankIndex: Int32Array
  tankLoss: Float64Array
  tankPropertyDamage: Float64Array
  tankBusinessInterruption: Float64Array
  /** 1 where the tank was set alight by a neighbour's fire, 0 by the flash. */
  tankBySpread: Uint8Array
}

/** Property damage and business interruption apart, per simulated year. */
export interface YearLossSplit {
  yearLosses: Float64Array
  yearMaxEventLoss: Float64Array
  summary: YearLossSummary
}

export interface TankYearResult {
  tankId: string
  tag: string
  direct: CountEstimate
  sparking: CountEstimate
  ignition: CountEstimate
  averageAnnualLoss: { mean: number; se: number }
  averageAnnualLossPd: { mean: number; se: number }
  averageAnnualLossBi: { mean: number; se: number }
  /** Times the tank burned because a neighbour's fire spread to it. */
  spreadIgnitions: number
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
  /** The same year-loss table for property damage and for business interruption alone. */
  propertyDamage: YearLossSplit
  businessInterruption: YearLossSplit
  tanks: TankYearResult[]
  /** Tank events of the site (a flash that strikes or sparks two tanks counts twice), Garwood intervals. */
  totals: { direct: CountEstimate; sparking: CountEstimate; ignition: CountEstimate }
  summary: YearLossSummary
}

interface Tally {
  direct: Float64Array; sparking: Float64Array; ignition: Float64Array; spread: Float64Array
  eventYear: number[]; eventPd: number[]; eventBi: number[]; eventTankStart: number[]; eventTankIndex: number[]
  eventTankPd: number[]; eventTankBi: number[]; eventTankBySpread: number[]
}

/** Simulate `years` years for one site. Deterministic in (site, assumptions, runSeed, years). */
export function simulateSiteYears(site: SiteInput, assumptions: AssumptionSet, options: YearOptions, prepared: SitePreparation = prepareSiteOnce(site, assumptions)): SiteYearResult {
  if (!Number.isInteger(options.years) || options.years < 1) throw new RangeError(`years must be a whole number ≥ 1, got ${options.years}`)
  const ps = prepared.ps
  const env = prepared.envelope()
  const rand = createStream(options.runSeed, site.id, 'years')
  // Spread draws come from a stream of their own, so switching spread off leaves every other draw unchanged.
  const spreadRand = createStream(options.runSeed, site.id, 'years/spread')
  const years = options.years
  const tally: Tally = {
    direct: new Float64Array(ps.nTanks), sparking: new Float64Array(ps.nTanks), ignition: new Float64Array(ps.nTanks), spread: new Float64Array(ps.nTanks),
    eventYear: [], eventPd: [], eventBi: [], eventTankStart: [], eventTankIndex: [], eventTankPd: [], eventTankBi: [], eventTankBySpread: [],
  }
  const burning = new Uint8Array(ps.nTanks)
  // Conditional on their total, the candidates of a Poisson process over Y years fall in
  // independent uniform years: one Poisson draw instead of one per year.
  // With storm clustering the candidates' years come from the run's storms (their own stream);
  // without, the draws below are exactly those of independent years.
  if (options.clustering && site.flashDensity > options.clustering.maxFlashDensity * (1 + 1e-12)) throw new RangeError(`storm clustering: the site's Ng (${site.flashDensity} flashes/km²/yr) is above the run's λmax (${options.clustering.maxFlashDensity})`)
  const clusteredYears = options.clustering ? clusteredCandidateYears(options.clustering, env.totalRate, years, options.runSeed, createStream(options.runSeed, site.id, 'years/storms')) : null
  const candidates = clusteredYears ? clusteredYears.length : poissonDraw(env.totalRate * years, rand)
  const flash: Candidate = { x: 0, y: 0, currentKa: 0, lnI: 0, cell: 0 }
  const probability = new Float64Array(ps.nTanks)
  const none = new Float64Array(ps.nTanks + 1)
  const hit = new Uint8Array(ps.nTanks)
  let eventFlashes = 0
  for (let c = 0; c < candidates; c++) {
    const year = clusteredYears ? clusteredYears[c]! : Math.min(years - 1, Math.floor(rand() * years))
    drawCandidate(ps, env, rand, flash)
    const attached = attachFlash(ps, flash.x, flash.y, strikeRadius(ps, flash.lnI))
    const anyEvent = 1 - siteEventProbabilities(ps, flash.currentKa, flash.lnI, attached, flash.x, flash.y, probability)
    if (rand() * cellBoundOf(env, flash.cell) >= anyEvent) continue
    eventFlashes += 1
    drawOutcome(ps.nTanks, probability, none, rand, hit)
    recordFlash(ps, attached, hit, year, rand, spreadRand, burning, tally)
  }
  return siteYearResult(ps, env, years, candidates, eventFlashes, tally)
}

/**
 * Which tanks have an event, given that at least one has: the first tank with an event is drawn
 * with P(t first | some event among t…n) = p_t / (1 − Π_{l ≥ t}(1 − p_l)), the rest independently.
 * `none[t]` holds Π_{l ≥ t}(1 − p_l).
 */
export function drawOutcome(n: number, p: Float64Array, none: Float64Array, rand: UniformStream, hit: Uint8Array): void {
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

/**
 * Count the flash's strikes and sparks, draw ignitions, let the fires spread (one generation: from
 * the tanks the flash set alight to their neighbours), draw each burning tank's damage, and record
 * one loss event covering every tank that burned.
 */
function recordFlash(ps: PreparedSite, attached: number, hit: Uint8Array, year: number, rand: UniformStream, spreadRand: UniformStream, burning: Uint8Array, tally: Tally): void {
  let eventPd = 0
  let eventBi = 0
  let started = false
  const add = (t: number, u: number, bySpread: boolean) => {
    const loss = burningTankLoss(ps.tanks[t]!, ps, u)
    if (!started) { tally.eventTankStart.push(tally.eventTankIndex.length); started = true }
    tally.eventTankIndex.push(t)
    tally.eventTankPd.push(loss.propertyDamage)
    tally.eventTankBi.push(loss.businessInterruption)
    tally.eventTankBySpread.push(bySpread ? 1 : 0)
    eventPd += loss.propertyDamage
    eventBi += loss.businessInterruption
  }
  let lit = 0
  for (let t = 0; t < ps.nTanks; t++) {
    if (hit[t] !== 1) continue
    const direct = attached === t
    if (direct) tally.direct[t]! += 1
    else tally.sparking[t]! += 1
    if (rand() >= (direct ? ps.pIgnDirect[t]! : ps.pIgnSpark[t]!)) continue
    tally.ignition[t]! += 1
    burning[t] = 1
    lit += 1
    add(t, rand(), false)
  }
  if (lit > 0 && ps.spread.spreadTank.length > 0) {
    spreadFires(ps.spread, ps.nTanks, burning, spreadRand, (j) => {
      tally.spread[j]! += 1
      add(j, spreadRand(), true)
    })
  }
  burning.fill(0)
  if (started) { tally.eventYear.push(year); tally.eventPd.push(eventPd); tally.eventBi.push(eventBi) }
}

/**
 * Each tank not yet burning catches fire with 1 − Π(1 − p_ij) over the tanks i the flash set alight
 * (neighbours in index order, one draw each); `onSpread(j)` then takes its further draws (the
 * damage) from the same stream. Shared with the storm loss (shared/storms/loss.ts).
 */
export function spreadFires(spread: SpreadTable, n: number, burning: Uint8Array, spreadRand: UniformStream, onSpread: (j: number) => void): void {
  const escape = new Float64Array(n).fill(1)
  let reachable = false
  for (let i = 0; i < n; i++) {
    if (burning[i] !== 1) continue
    for (let k = spread.spreadStart[i]!; k < spread.spreadStart[i + 1]!; k++) {
      const j = spread.spreadTank[k]!
      if (burning[j] === 1) continue
      escape[j]! *= 1 - spread.spreadProbability[k]!
      reachable = true
    }
  }
  if (!reachable) return
  for (let j = 0; j < n; j++) {
    if (burning[j] === 1 || escape[j] === 1) continue
    if (spreadRand() >= 1 - escape[j]!) continue
    onSpread(j)
  }
}

function siteYearResult(ps: PreparedSite, env: Envelope, years: number, candidates: number, eventFlashes: number, tally: Tally): SiteYearResult {
  const events = sortedEvents(tally, years)
  const { yearLosses, yearMaxEventLoss } = yearTable(events.year, events.loss, years)
  const radiusM = siteRadius(ps)
  const annualLosses = tankAnnualLosses(events.year, events.tankStart, events.tankIndex, events.tankLoss, ps.nTanks, years)
  const annualPd = tankAnnualLosses(events.year, events.tankStart, events.tankIndex, events.tankPropertyDamage, ps.nTanks, years)
  const annualBi = tankAnnualLosses(events.year, events.tankStart, events.tankIndex, events.tankBusinessInterruption, ps.nTanks, years)
  return {
    siteId: ps.siteId, mode: 'year', attachmentModel: ps.attachmentModel, years, radiusM,
    lambdaPerYear: flashesPerYearOnDisc(ps.flashDensity, radiusM),
    candidateRatePerYear: env.totalRate, candidates, eventFlashes,
    yearLosses, yearMaxEventLoss, events,
    propertyDamage: yearSplit(events.year, events.propertyDamage, years),
    businessInterruption: yearSplit(events.year, events.businessInterruption, years),
    tanks: ps.tanks.map((tank, t) => ({
      tankId: tank.id, tag: tank.tag,
      direct: countEstimate(tally.direct[t]!, years),
      sparking: countEstimate(tally.sparking[t]!, years),
      ignition: countEstimate(tally.ignition[t]!, years),
      averageAnnualLoss: annualLosses[t]!,
      averageAnnualLossPd: annualPd[t]!,
      averageAnnualLossBi: annualBi[t]!,
      spreadIgnitions: tally.spread[t]!,
    })),
    totals: {
      direct: countEstimate(sum(tally.direct), years),
      sparking: countEstimate(sum(tally.sparking), years),
      ignition: countEstimate(sum(tally.ignition), years),
    },
    summary: summariseYearLosses(yearLosses, yearMaxEventLoss),
  }
}

/** Per simulated year: the sum of the events' losses and the largest one. */
export function yearTable(eventYear: ArrayLike<number>, eventLoss: ArrayLike<number>, years: number): { yearLosses: Float64Array; yearMaxEventLoss: Float64Array } {
  const yearLosses = new Float64Array(years)
  const yearMaxEventLoss = new Float64Array(years)
  for (let e = 0; e < eventYear.length; e++) {
    const y = eventYear[e]!
    yearLosses[y]! += eventLoss[e]!
    if (eventLoss[e]! > yearMaxEventLoss[y]!) yearMaxEventLoss[y] = eventLoss[e]!
  }
  return { yearLosses, yearMaxEventLoss }
}

function yearSplit(eventYear: ArrayLike<number>, eventLoss: ArrayLike<number>, years: number): YearLossSplit {
  const t = yearTable(eventYear, eventLoss, years)
  return { ...t, summary: summariseYearLosses(t.yearLosses, t.yearMaxEventLoss) }
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
    year: new Int32Array(n), loss: new Float64Array(n), propertyDamage: new Float64Array(n), businessInterruption: new Float64Array(n),
    tankCount: new Int32Array(n), tankStart: new Int32Array(n + 1),
    tankIndex: new Int32Array(tankTotal), tankLoss: new Float64Array(tankTotal),
    tankPropertyDamage: new Float64Array(tankTotal), tankBusinessInterruption: new Float64Array(tankTotal), tankBySpread: new Uint8Array(tankTotal),
  }
  let cursor = 0
  for (let rank = 0; rank < n; rank++) {
    const e = order[rank]!
    table.year[rank] = tally.eventYear[e]!
    table.propertyDamage[rank] = tally.eventPd[e]!
    table.businessInterruption[rank] = tally.eventBi[e]!
    table.loss[rank] = tally.eventPd[e]! + tally.eventBi[e]!
    table.tankStart[rank] = cursor
    const end = e + 1 < n ? starts[e + 1]! : tankTotal
    for (let k = starts[e]!; k < end; k++) {
      table.tankIndex[cursor] = tally.eventTankIndex[k]!
      table.tankPropertyDamage[cursor] = tally.eventTankPd[k]!
      table.tankBusinessInterruption[cursor] = tally.eventTankBi[k]!
      table.tankLoss[cursor] = tally.eventTankPd[k]! + tally.eventTankBi[k]!
      table.tankBySpread[cursor] = tally.eventTankBySpread[k]!
      cursor += 1
    }
    table.tankCount[rank] = cursor - table.tankStart[rank]!
  }
  table.tankStart[n] = cursor
  return table
}

/** Every tank's average annual loss and its standard error over the simulated years, in one pass over the events. */
function tankAnnualLosses(eventYear: Int32Array, tankStart: Int32Array, tankIndex: Int32Array, tankLoss: Float64Array, nTanks: number, years: number): { mean: number; se: number }[] {
  const events = { year: eventYear, tankStart, tankIndex, tankLoss }
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
