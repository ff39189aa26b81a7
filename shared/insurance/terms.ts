// Policy terms on a site's simulated loss events. Order of application (common practice for
// per-risk covers): each event's property damage goes through the per-occurrence deductible and its
// business interruption through the interruption deductible (the waiting period, as money); their
// sum goes through the per-occurrence limit; the year's occurrence-net losses, taken in event order, go through the annual aggregate
// deductible and limit; the insurer's share applies last. Framework-free: used by the server, the
// workbook export and tests alike. Money is in the organisation's currency throughout.

export interface SiteTerms {
  /** Per-occurrence deductible (≥ 0). */
  occurrenceDeductible: number
  /** Per-occurrence limit above the deductible; null = unlimited. */
  occurrenceLimit: number | null
  /** Annual aggregate deductible on the occurrence-net losses (≥ 0). */
  aggregateDeductible: number
  /** Annual aggregate limit above the aggregate deductible; null = unlimited. */
  aggregateLimit: number | null
  /**
   * Waiting period on business interruption, as a money deductible on each event's interruption
   * part (a waiting period of D days: D × the daily interruption value). ≥ 0.
   */
  interruptionDeductible: number
  /** The insurer's share of the loss after terms, 0–1. */
  share: number
}

/** No deductibles, no limits, the whole loss: gives back the ground-up figures. */
export const NO_TERMS: Readonly<SiteTerms> = Object.freeze({ occurrenceDeductible: 0, occurrenceLimit: null, aggregateDeductible: 0, aggregateLimit: null, interruptionDeductible: 0, share: 1 })

/**
 * A site's loss events: the simulated year of each event and its ground-up loss, in event order,
 * with the property-damage part of each loss (business interruption = loss − property damage).
 * Without `propertyDamage` (events stored before the split) the whole loss is treated as property
 * damage: the occurrence deductible applies to it as it did then, and the view says "total only".
 */
export interface SiteEvents {
  year: ArrayLike<number>
  loss: ArrayLike<number>
  propertyDamage?: ArrayLike<number> | null
}

export type LossPart = 'propertyDamage' | 'businessInterruption'
export const LOSS_PARTS: readonly LossPart[] = ['propertyDamage', 'businessInterruption']

/** Per simulated year: the total loss and the largest single event (for the occurrence curve). */
export interface YearTable {
  yearLosses: Float64Array
  yearMaxEventLoss: Float64Array
}

export interface SiteFinancialTables {
  groundUp: YearTable
  /** After deductibles and limits, before the insurer's share (100 % of the cover). */
  afterTerms: YearTable
  /** The insurer's part: after terms × share. */
  insured: YearTable
  /** The same three tables for property damage and for business interruption alone. */
  split: Record<LossPart, { groundUp: YearTable, afterTerms: YearTable, insured: YearTable }>
  /** Per event, in the input's order (the property-damage part beside each total). */
  eventAfterTerms: Float64Array
  eventInsured: Float64Array
  eventAfterTermsPd: Float64Array
  eventInsuredPd: Float64Array
  /** Years in which some loss got past the deductibles (a claim is paid). */
  deductibleReachedYears: number
  /** Years with any ground-up loss. */
  lossYears: number
}

const cap = (value: number, limit: number | null) => (limit === null ? value : Math.min(value, limit))

/** One event through the per-occurrence deductible and limit. */
export function occurrenceNet(loss: number, terms: SiteTerms): number {
  return cap(Math.max(0, loss - terms.occurrenceDeductible), terms.occurrenceLimit)
}

/**
 * One event through the per-occurrence terms with its parts apart: property damage less the
 * occurrence deductible, interruption less the interruption deductible, their sum capped by the
 * occurrence limit; a cap is shared between the parts in proportion (so the parts add up).
 */
export function occurrenceNetSplit(propertyDamage: number, businessInterruption: number, terms: SiteTerms): { total: number, propertyDamageShare: number } {
  const pd = Math.max(0, propertyDamage - terms.occurrenceDeductible)
  const bi = Math.max(0, businessInterruption - terms.interruptionDeductible)
  const total = cap(pd + bi, terms.occurrenceLimit)
  return { total, propertyDamageShare: pd + bi > 0 ? pd / (pd + bi) : 1 }
}

/** occurrenceNetSplit's total alone, without an object per call (for the storm loss's inner loops). */
export function occurrenceNetTotal(propertyDamage: number, businessInterruption: number, terms: SiteTerms): number {
  return cap(Math.max(0, propertyDamage - terms.occurrenceDeductible) + Math.max(0, businessInterruption - terms.interruptionDeductible), terms.occurrenceLimit)
}

/** The annual aggregate cover on a running total of occurrence-net losses. */
export function aggregateNet(cumulative: number, terms: SiteTerms): number {
  return cap(Math.max(0, cumulative - terms.aggregateDeductible), terms.aggregateLimit)
}

function emptyTable(years: number): YearTable {
  return { yearLosses: new Float64Array(years), yearMaxEventLoss: new Float64Array(years) }
}

function add(table: YearTable, year: number, loss: number) {
  table.yearLosses[year]! += loss
  if (loss > table.yearMaxEventLoss[year]!) table.yearMaxEventLoss[year] = loss
}

/**
 * Applies a site's terms to its events. Each event's part of the aggregate cover is the increase of
 * the covered running total it causes, so the events of a year add up to the year's covered loss
 * and the occurrence curve after terms reflects the aggregate deductible being eroded in event order.
 */
export function applySiteTerms(events: SiteEvents, years: number, terms: SiteTerms = NO_TERMS): SiteFinancialTables {
  const n = events.year.length
  if (events.loss.length !== n) throw new RangeError('every event needs a year and a loss')
  const groundUp = emptyTable(years)
  const afterTerms = emptyTable(years)
  const insured = emptyTable(years)
  const eventAfterTerms = new Float64Array(n)
  const eventInsured = new Float64Array(n)
  const eventAfterTermsPd = new Float64Array(n)
  const eventInsuredPd = new Float64Array(n)
  const split = {
    propertyDamage: { groundUp: emptyTable(years), afterTerms: emptyTable(years), insured: emptyTable(years) },
    businessInterruption: { groundUp: emptyTable(years), afterTerms: emptyTable(years), insured: emptyTable(years) },
  }
  const pdOf = events.propertyDamage ?? null
  if (pdOf !== null && pdOf.length !== n) throw new RangeError('every event needs its property-damage part')
  // Running occurrence-net total of each year (events of one year need not be adjacent).
  const running = new Float64Array(years)
  for (let k = 0; k < n; k++) {
    const y = events.year[k]!
    if (!(y >= 0 && y < years)) throw new RangeError(`event ${k} lies in year ${y}, outside 0…${years - 1}`)
    const loss = events.loss[k]!
    const pd = pdOf === null ? loss : pdOf[k]!
    const bi = loss - pd
    const net = occurrenceNetSplit(pd, bi, terms)
    const before = aggregateNet(running[y]!, terms)
    running[y]! += net.total
    const covered = aggregateNet(running[y]!, terms) - before
    const coveredPd = covered * net.propertyDamageShare
    eventAfterTerms[k] = covered
    eventInsured[k] = covered * terms.share
    eventAfterTermsPd[k] = coveredPd
    eventInsuredPd[k] = coveredPd * terms.share
    add(groundUp, y, loss)
    add(afterTerms, y, covered)
    add(insured, y, covered * terms.share)
    add(split.propertyDamage.groundUp, y, pd)
    add(split.propertyDamage.afterTerms, y, coveredPd)
    add(split.propertyDamage.insured, y, coveredPd * terms.share)
    add(split.businessInterruption.groundUp, y, bi)
    add(split.businessInterruption.afterTerms, y, covered - coveredPd)
    add(split.businessInterruption.insured, y, (covered - coveredPd) * terms.share)
  }
  let deductibleReachedYears = 0
  let lossYears = 0
  for (let y = 0; y < years; y++) {
    if (afterTerms.yearLosses[y]! > 0) deductibleReachedYears += 1
    if (groundUp.yearLosses[y]! > 0) lossYears += 1
  }
  return { groundUp, afterTerms, insured, split, eventAfterTerms, eventInsured, eventAfterTermsPd, eventInsuredPd, deductibleReachedYears, lossYears }
}

/** Checks terms a person entered (or imported); returns a message per field, empty when valid. */
export function termsProblems(terms: SiteTerms): Partial<Record<keyof SiteTerms, string>> {
  const problems: Partial<Record<keyof SiteTerms, string>> = {}
  const money = (v: number | null) => v === null || (Number.isFinite(v) && v >= 0)
  if (!money(terms.occurrenceDeductible)) problems.occurrenceDeductible = 'The occurrence deductible is an amount of 0 or more.'
  if (!money(terms.aggregateDeductible)) problems.aggregateDeductible = 'The aggregate deductible is an amount of 0 or more.'
  if (!money(terms.interruptionDeductible)) problems.interruptionDeductible = 'The interruption deductible (waiting period) is an amount of 0 or more.'
  if (terms.occurrenceLimit !== null && !(terms.occurrenceLimit > 0 && Number.isFinite(terms.occurrenceLimit))) problems.occurrenceLimit = 'The occurrence limit is more than 0, or empty for no limit.'
  if (terms.aggregateLimit !== null && !(terms.aggregateLimit > 0 && Number.isFinite(terms.aggregateLimit))) problems.aggregateLimit = 'The aggregate limit is more than 0, or empty for no limit.'
  if (!(terms.share >= 0 && terms.share <= 1)) problems.share = 'The share is between 0 % and 100 %.'
  return problems
}
