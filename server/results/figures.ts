// Reading result figures (shared/results/figure.ts) out of the result tables: one helper that
// selects a figure's columns as a nested object (Drizzle types the answer from the columns), and one
// that rebuilds the figure from it. The tables declare the same columns with
// server/db/schema/figures.ts.
import type { AnyPgColumn } from 'drizzle-orm/pg-core'
import type { runPortfolioResults, runSiteResults, runTankResults } from '../db/schema'
import type { FigureName, RateFigureName, ResultFigure } from '../../shared/results/figure'
import { prefixed } from '../db/schema/figures'

type RateTable<P extends RateFigureName> = { [K in `${P}Rate` | `${P}Lo` | `${P}Hi` | `${P}Count`]: AnyPgColumn }
type MoneyTable = { [K in 'expectedAnnualLoss' | 'expectedAnnualLossLo' | 'expectedAnnualLossHi']: AnyPgColumn }
type SeTable<P extends FigureName> = { [K in `${P}Se`]: AnyPgColumn }

/** The columns of an event frequency, for a nested select: `{ rate, lo, hi, count }`. */
export function selectRate<T extends RateTable<P>, P extends RateFigureName>(t: T, p: P) {
  return { rate: t[`${p}Rate` as const], lo: t[`${p}Lo` as const], hi: t[`${p}Hi` as const], count: t[`${p}Count` as const] }
}

/** The columns of the average annual loss, for a nested select: `{ rate, lo, hi }`. */
export function selectMoney<T extends MoneyTable>(t: T): { rate: T['expectedAnnualLoss'], lo: T['expectedAnnualLossLo'], hi: T['expectedAnnualLossHi'] } {
  return { rate: t.expectedAnnualLoss, lo: t.expectedAnnualLossLo, hi: t.expectedAnnualLossHi }
}

/** A figure's columns with its standard error (site and portfolio rows). */
function withSe<T extends SeTable<P>, P extends FigureName, S extends object>(t: T, p: P, selection: S) {
  return { ...selection, se: t[`${p}Se` as const] }
}

/** The four figures of tank rows (no standard errors kept). */
export function selectTankFigures(t: typeof runTankResults) {
  return { direct: selectRate(t, 'direct'), sparking: selectRate(t, 'sparking'), ignition: selectRate(t, 'ignition'), expectedAnnualLoss: selectMoney(t) }
}

/** The four figures of site or portfolio rows, with their standard errors. */
export function selectFigures<T extends typeof runSiteResults | typeof runPortfolioResults>(t: T) {
  return {
    direct: withSe(t, 'direct', selectRate(t, 'direct')),
    sparking: withSe(t, 'sparking', selectRate(t, 'sparking')),
    ignition: withSe(t, 'ignition', selectRate(t, 'ignition')),
    expectedAnnualLoss: withSe(t, 'expectedAnnualLoss', selectMoney(t)),
  }
}

/** What a nested figure select answers (count and se absent where the row keeps none). */
export interface SelectedFigure<Se extends number | null = number | null> { rate: number, lo: number, hi: number, count?: number | null, se?: Se }

/** Rebuilds the figure from its selected columns; `upperBoundOnly` from the row's negligible-rate list. */
export function toFigure<Se extends number>(c: SelectedFigure<Se> & { se: Se }, upperBoundOnly?: boolean): ResultFigure<Se>
export function toFigure(c: SelectedFigure, upperBoundOnly?: boolean): ResultFigure
export function toFigure(c: SelectedFigure, upperBoundOnly = false): ResultFigure {
  return { rate: c.rate, lo: c.lo, hi: c.hi, se: c.se ?? null, count: c.count ?? null, upperBoundOnly }
}

export interface ResultFigures<Se extends number | null = number | null> {
  direct: ResultFigure<Se>
  sparking: ResultFigure<Se>
  ignition: ResultFigure<Se>
  expectedAnnualLoss: ResultFigure<Se>
}

type Selected<Se extends number | null> = { [K in FigureName]: SelectedFigure<Se> & (Se extends number ? { se: Se } : object) }

/** Rebuilds the four figures of a row; a tank row's `upperBoundFigures` marks those stopped by the negligible-rate rule. */
export function toFigures(row: Selected<number>, upperBoundFigures?: readonly string[]): ResultFigures<number>
export function toFigures(row: Selected<number | null>, upperBoundFigures?: readonly string[]): ResultFigures
export function toFigures(row: Selected<number | null>, upperBoundFigures: readonly string[] = []): ResultFigures {
  const f = (name: FigureName) => toFigure(row[name], upperBoundFigures.includes(name))
  return { direct: f('direct'), sparking: f('sparking'), ignition: f('ignition'), expectedAnnualLoss: f('expectedAnnualLoss') }
}

/** The column values of a figure for an insert: `{ directRate, directLo, directHi, directCount }`. */
const rateValues = <P extends RateFigureName>(p: P, f: ResultFigure) => prefixed(p, { rate: f.rate, lo: f.lo, hi: f.hi, count: f.count })
const moneyValues = (f: ResultFigure) => prefixed('expectedAnnualLoss', { '': f.rate, lo: f.lo, hi: f.hi })

/** The four figures as the columns of a tank row (which keeps no standard errors). */
export function tankFigureValues(f: ResultFigures) {
  return { ...rateValues('direct', f.direct), ...rateValues('sparking', f.sparking), ...rateValues('ignition', f.ignition), ...moneyValues(f.expectedAnnualLoss) }
}

/** The four figures as the columns of a site or portfolio row, with their standard errors. */
export function figureValues(f: ResultFigures<number>) {
  return {
    ...tankFigureValues(f),
    directSe: f.direct.se, sparkingSe: f.sparking.se, ignitionSe: f.ignition.se, expectedAnnualLossSe: f.expectedAnnualLoss.se,
  }
}
