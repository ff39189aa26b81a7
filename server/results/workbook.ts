// The results workbook of a run: Summary (headline figures, cautions, provenance), Sites, Tanks,
// Exceedance, Assumptions — written by the one sheet writer (server/utils/sheets.ts): units in every
// header, readable number formats, frozen headers and filters, text from people formula-safe.
import { assumptionParameterMeta } from '../../shared/engine/assumptions'
import { getPath } from '../../shared/paths'
import { formatMoneyRange, formatRange, formatUpperBound } from '../../shared/format'
import type { runs } from '../db/schema'
import type { PortfolioResult, SiteResult, TankResult } from './queries'
import { addCautionSheet, addTableSheet, blankRow, decimalsFor, headingRow, newWorkbook, NUMBER_FORMATS, valueRow, type SheetColumn, type SummaryRow } from '../utils/sheets'
import { workbookBytes } from '../utils/downloads'
import type { DrawBands } from '../../shared/results/draws'

export interface WorkbookInput {
  run: typeof runs.$inferSelect
  portfolio: PortfolioResult
  sites: SiteResult[]
  tanks: TankResult[]
  assumptions: { setName: string, version: number, parameters: unknown }
  requestedBy: string | null
  exportedBy: string
  currency: string
  publicUrl: string
}

const MONEY = NUMBER_FORMATS.money
const ONLY_TOTAL = 'total only (run made before the split)'

/** The run's mode in the product's words. */
export function modeLabel(run: Pick<typeof runs.$inferSelect, 'mode' | 'years' | 'targetRse' | 'negligibleRatePerYear'> & { stormClustering?: boolean }): string {
  return run.mode === 'year'
    ? `simulated years (${run.years} per site; storm clustering ${run.stormClustering ? 'on: nearby sites share storms' : 'off: sites independent'})`
    : `frequency (target relative standard error ${run.targetRse}; negligible-rate rule ${run.negligibleRatePerYear > 0 ? `${run.negligibleRatePerYear} /yr` : 'off'})`
}

/** Columns of the assumption band (5 % and 95 % across draws; empty for runs without draws). */
function bandColumns(freq: string, c: string): SheetColumn[] {
  const note = 'Assumption band: 5 % / 95 % points across the draws of the uncertain assumptions (empty: no assumption draws) — not the simulation interval.'
  return [
    { header: 'Expected fires, assumption band 5 %, /yr', key: 'bIgn05', unit: 'fires per year', numFmt: freq, note },
    { header: 'Expected fires, assumption band 95 %, /yr', key: 'bIgn95', unit: 'fires per year', numFmt: freq, note },
    { header: `AAL, assumption band 5 %, ${c}/yr`, key: 'bEal05', unit: `${c} per year`, numFmt: MONEY, note },
    { header: `AAL, assumption band 95 %, ${c}/yr`, key: 'bEal95', unit: `${c} per year`, numFmt: MONEY, note },
  ]
}

function bandCells(b: DrawBands | null) {
  return { bIgn05: b?.ignition.p05 ?? null, bIgn95: b?.ignition.p95 ?? null, bEal05: b?.expectedAnnualLoss.p05 ?? null, bEal95: b?.expectedAnnualLoss.p95 ?? null }
}

export async function writeResultsWorkbook(input: WorkbookInput): Promise<Buffer> {
  const { run, portfolio: p, currency: c } = input
  const wb = newWorkbook()
  const ys = p.yearSummary
  const { ignition, sparking, direct, expectedAnnualLoss: eal } = p.figures
  const freq = decimalsFor([ignition, sparking, direct].flatMap(f => [f.rate, f.lo, f.hi]))
  const rows: SummaryRow[] = [
    valueRow('Methodology', `${input.publicUrl}/methodology`),
    blankRow,
    headingRow('Figure'),
    { cells: ['Expected fires, /yr', ignition.rate, ignition.lo, ignition.hi, `${formatRange(ignition.lo, ignition.hi, 2, undefined, ignition.rate)} /yr`], numFmt: freq },
    { cells: ['Induced sparking, /yr', sparking.rate, sparking.lo, sparking.hi, `${formatRange(sparking.lo, sparking.hi, 2, undefined, sparking.rate)} /yr`], numFmt: freq },
    { cells: ['Direct strikes on tanks, /yr', direct.rate, direct.lo, direct.hi, `${formatRange(direct.lo, direct.hi, 2, undefined, direct.rate)} /yr`], numFmt: freq },
    { cells: [`Average annual loss (AAL), ${c}/yr`, eal.rate, eal.lo, eal.hi, formatMoneyRange(eal.lo, eal.hi, c)], numFmt: MONEY },
  ]
  rows[2]!.cells.push('Estimate', '95 % low', '95 % high', '95 % interval (as printed)')
  for (const T of [100, 250]) {
    const row = ys?.aggregate.find(r => r.returnPeriodYears === T)
    const iv = ys?.intervals?.aggregate.find(r => r.returnPeriodYears === T)
    rows.push({ cells: [`Aggregate loss (year total) at ${T} years, ${c}`, row?.loss ?? null, iv?.lo ?? null, iv?.hi ?? null], numFmt: MONEY })
  }
  const tail = ys?.aggregate.find(r => r.returnPeriodYears === 250)?.tailValueAtRisk ?? null
  // Assumption uncertainty, apart from the simulation interval above.
  const d = p.draws
  rows.push(blankRow, headingRow(d ? `Assumption band across ${d.draws} draws of the uncertain assumptions` : 'Assumption band: no assumption draws in this run'))
  if (d) {
    rows[rows.length - 1]!.cells.push('5 %', '50 %', '95 %')
    const bandRow = (label: string, b: { p05: number, p50: number, p95: number }, numFmt: string) => ({ cells: [label, b.p05, b.p50, b.p95], numFmt })
    rows.push(
      bandRow('Expected fires, /yr', d.bands.ignition, freq), bandRow('Induced sparking, /yr', d.bands.sparking, freq),
      bandRow('Direct strikes on tanks, /yr', d.bands.direct, freq), bandRow(`Average annual loss (AAL), ${c}/yr`, d.bands.expectedAnnualLoss, MONEY),
    )
    // Simulated-years runs: the return-period losses' bands (each draw re-simulated over fewer years; empty: too few losses).
    for (const T of [100, 250]) {
      const y = d.years
      if (!y) break
      const b = y.aggregate.find(r => r.returnPeriodYears === T)?.band ?? null
      rows.push({ cells: [`Aggregate loss (year total) at ${T} years, ${c} (draws re-simulated over ${y.years} years)`, b?.p05 ?? null, b?.p50 ?? null, b?.p95 ?? null], numFmt: MONEY })
    }
  }
  rows.push(blankRow)
  rows.push(
    valueRow(`Tail value-at-risk at 250 years, ${c}`, tail, MONEY),
    valueRow(`Average annual loss (AAL), property damage, ${c}/yr`, p.lossSplit ? p.lossSplit.propertyDamage : ONLY_TOTAL, MONEY),
    valueRow(`Average annual loss (AAL), business interruption, ${c}/yr`, p.lossSplit ? p.lossSplit.businessInterruption : ONLY_TOTAL, MONEY),
    blankRow, headingRow('Provenance'),
    valueRow('Run id', run.id), valueRow('Portfolio', run.portfolioName), valueRow('Mode', modeLabel(run)),
    valueRow('Seed', run.seed), valueRow('Engine version', run.engineVersion), valueRow('Assumption set', `${input.assumptions.setName} — version ${input.assumptions.version}`),
    valueRow('Input hash (sha-256)', run.inputHash), valueRow('Started by', input.requestedBy ?? '—'), valueRow('Created', run.createdAt.toISOString()),
    valueRow('Finished', run.finishedAt?.toISOString() ?? ''), valueRow('Exported by', input.exportedBy), valueRow('Exported', new Date().toISOString()),
    valueRow('Currency', c),
    valueRow('Number formats', 'frequencies per year with fixed decimals (three significant digits of the column\'s smallest value); money in whole units of the currency; shares as per cent'),
  )
  addCautionSheet(wb, { title: 'Stormledger results workbook', rows, widths: [52, 22, 22, 22, 34] })

  const siteFreq = decimalsFor(input.sites.flatMap(s => [s.figures.ignition.lo, s.figures.sparking.rate, s.figures.direct.rate]))
  addTableSheet(wb, 'Sites', [
    { header: 'Site', key: 'name', unit: '', width: 30 }, { header: 'Site reference', key: 'externalId', unit: '', width: 14 }, { header: 'Operator', key: 'operator', unit: '', width: 24 },
    { header: 'Latitude, ° (WGS 84)', key: 'lat', unit: 'decimal degrees', numFmt: NUMBER_FORMATS.coordinate }, { header: 'Longitude, ° (WGS 84)', key: 'lon', unit: 'decimal degrees', numFmt: NUMBER_FORMATS.coordinate },
    { header: 'Tanks, count', key: 'tanks', unit: 'count', numFmt: NUMBER_FORMATS.count }, { header: 'Simulated radius, m', key: 'radius', unit: 'm', numFmt: NUMBER_FORMATS.metres },
    { header: 'Expected fires, /yr', key: 'ign', unit: 'fires per year', numFmt: siteFreq }, { header: 'Expected fires, 95 % low, /yr', key: 'ignLo', unit: 'fires per year', numFmt: siteFreq }, { header: 'Expected fires, 95 % high, /yr', key: 'ignHi', unit: 'fires per year', numFmt: siteFreq },
    { header: 'Induced sparking, /yr', key: 'spk', unit: 'events per year', numFmt: siteFreq }, { header: 'Direct strikes on tanks, /yr', key: 'dir', unit: 'strikes per year', numFmt: siteFreq },
    { header: `Average annual loss (AAL), ${c}/yr`, key: 'eal', unit: `${c} per year`, numFmt: MONEY },
    { header: `AAL, property damage, ${c}/yr`, key: 'pd', unit: `${c} per year`, numFmt: MONEY }, { header: `AAL, business interruption, ${c}/yr`, key: 'bi', unit: `${c} per year`, numFmt: MONEY },
    { header: `Aggregate loss (year total) at 100 years, ${c}`, key: 'l100', unit: c, numFmt: MONEY },
    ...bandColumns(siteFreq, c),
  ], input.sites.map(s => ({
    ...bandCells(s.assumptionBands),
    pd: s.lossSplit?.propertyDamage ?? null, bi: s.lossSplit?.businessInterruption ?? null,
    name: s.facts.name, externalId: s.facts.externalId, operator: s.facts.operatorName, lat: s.facts.latitudeDeg, lon: s.facts.longitudeDeg,
    tanks: s.tanks, radius: s.radiusM, ign: s.figures.ignition.rate, ignLo: s.figures.ignition.lo, ignHi: s.figures.ignition.hi, spk: s.figures.sparking.rate, dir: s.figures.direct.rate, eal: s.figures.expectedAnnualLoss.rate, l100: s.lossAt100,
  })))

  const siteName = new Map(input.sites.map(s => [s.siteId, s.facts.name]))
  const tankFreq = decimalsFor(input.tanks.flatMap(t => [t.figures.ignition.rate, t.figures.sparking.rate, t.figures.direct.rate]))
  const tankColumns: SheetColumn[] = [
    { header: 'Site', key: 'site', unit: '', width: 30 }, { header: 'Tank', key: 'tag', unit: '', width: 12 },
    { header: 'Expected fires, /yr', key: 'ign', unit: 'fires per year', numFmt: tankFreq }, { header: 'Expected fires, 95 % low, /yr', key: 'ignLo', unit: 'fires per year', numFmt: tankFreq }, { header: 'Expected fires, 95 % high, /yr', key: 'ignHi', unit: 'fires per year', numFmt: tankFreq },
    { header: 'Induced sparking, /yr', key: 'spk', unit: 'events per year', numFmt: tankFreq }, { header: 'Induced sparking, 95 % low, /yr', key: 'spkLo', unit: 'events per year', numFmt: tankFreq }, { header: 'Induced sparking, 95 % high, /yr', key: 'spkHi', unit: 'events per year', numFmt: tankFreq },
    { header: 'Direct strikes, /yr', key: 'dir', unit: 'strikes per year', numFmt: tankFreq },
    { header: `Average annual loss (AAL), ${c}/yr`, key: 'eal', unit: `${c} per year`, numFmt: MONEY },
    { header: `AAL, property damage, ${c}/yr`, key: 'pd', unit: `${c} per year`, numFmt: MONEY }, { header: `AAL, business interruption, ${c}/yr`, key: 'bi', unit: `${c} per year`, numFmt: MONEY },
    { header: 'Driving component class', key: 'cls', unit: '', width: 24 }, { header: 'Samples, count', key: 'samples', unit: 'count', numFmt: NUMBER_FORMATS.count },
    { header: 'Upper bound only (negligible)', key: 'bound', unit: '', width: 30, note: 'Figures stopped by the negligible-rate rule: their 95 % high is an upper bound, with no low end.' },
    { header: 'Expected fires, 95 % interval, /yr', key: 'ignText', unit: 'fires per year', width: 30 },
    { header: 'Direct strikes in the simulated years, count', key: 'dirN', unit: 'count', numFmt: NUMBER_FORMATS.count }, { header: 'Induced sparks in the simulated years, count', key: 'spkN', unit: 'count', numFmt: NUMBER_FORMATS.count },
    { header: 'Fires in the simulated years, count', key: 'ignN', unit: 'count', numFmt: NUMBER_FORMATS.count },
    ...bandColumns(tankFreq, c),
  ]
  addTableSheet(wb, 'Tanks', tankColumns, input.tanks.map((t) => {
    // A figure stopped by the negligible-rate rule has no lower end: its "hi" is an upper bound.
    const f = t.figures
    const bounded = (['sparking', 'ignition', 'expectedAnnualLoss'] as const).filter(k => f[k].upperBoundOnly)
    return {
      ...bandCells(t.draws?.bands ?? null),
      pd: t.lossSplit?.propertyDamage ?? null, bi: t.lossSplit?.businessInterruption ?? null,
      site: siteName.get(t.siteId), tag: t.tag, ign: f.ignition.rate, ignLo: f.ignition.upperBoundOnly ? null : f.ignition.lo, ignHi: f.ignition.hi,
      spk: f.sparking.rate, spkLo: f.sparking.upperBoundOnly ? null : f.sparking.lo, spkHi: f.sparking.hi, dir: f.direct.rate, eal: f.expectedAnnualLoss.rate, cls: t.drivingComponentClass ?? '', samples: t.samples,
      bound: bounded.length > 0 ? `${bounded.join(', ')} (negligible: hi is an upper bound)` : '',
      ignText: f.ignition.upperBoundOnly ? formatUpperBound(f.ignition.hi) : formatRange(f.ignition.lo, f.ignition.hi, 2, undefined, f.ignition.rate),
      dirN: f.direct.count, spkN: f.sparking.count, ignN: f.ignition.count,
    }
  }))

  if (ys) {
    addTableSheet(wb, 'Exceedance', [
      { header: 'Return period, years', key: 'T', unit: 'years', numFmt: NUMBER_FORMATS.years },
      { header: `Aggregate loss (year total), ${c}`, key: 'agg', unit: c, numFmt: MONEY },
      { header: `Aggregate loss, 95 % low, ${c}`, key: 'aggLo', unit: c, numFmt: MONEY }, { header: `Aggregate loss, 95 % high, ${c}`, key: 'aggHi', unit: c, numFmt: MONEY },
      { header: `Occurrence loss (largest event), ${c}`, key: 'occ', unit: c, numFmt: MONEY }, { header: `Tail value-at-risk, ${c}`, key: 'tvar', unit: c, numFmt: MONEY },
    ], ys.aggregate.map((r, k) => ({
      T: r.returnPeriodYears, agg: r.loss, aggLo: ys.intervals?.aggregate[k]?.lo ?? null, aggHi: ys.intervals?.aggregate[k]?.hi ?? null,
      occ: ys.occurrence[k]?.loss ?? null, tvar: r.tailValueAtRisk,
    })))
  } else {
    wb.addWorksheet('Exceedance').getCell(1, 1).value = 'Exceedance tables come from simulated-years runs; this run estimated frequencies.'
  }

  if (d) {
    addTableSheet(wb, 'Sensitivity', [
      { header: 'Figure', key: 'metric', unit: '', width: 24 }, { header: 'Rank', key: 'rank', unit: 'count', numFmt: NUMBER_FORMATS.count },
      { header: 'Uncertain assumption', key: 'label', unit: '', width: 60 }, { header: 'Path', key: 'path', unit: '', width: 40 },
      { header: 'Total-effect index', key: 'st', unit: 'share of variance', numFmt: '0.000' }, { header: 'Total effect, standard error', key: 'stSe', unit: 'share of variance', numFmt: '0.000' },
      { header: 'First-order index', key: 's1', unit: 'share of variance', numFmt: '0.000' }, { header: 'First order, standard error', key: 's1Se', unit: 'share of variance', numFmt: '0.000' },
    ], d.sensitivity.flatMap(r => r.indices.map((i, k) => ({
      metric: r.metric === 'aal' ? 'Average annual loss' : 'Expected fires', rank: k + 1, label: i.label, path: i.path,
      st: i.totalEffect.estimate, stSe: i.totalEffect.se, s1: i.firstOrder.estimate, s1Se: i.firstOrder.se,
    }))))
  }

  addTableSheet(wb, 'Assumptions', [
    { header: 'Parameter', key: 'label', unit: '', width: 60 }, { header: 'Value', key: 'value', unit: '', width: 18 }, { header: 'Unit', key: 'unit', unit: '', width: 16 }, { header: 'Source', key: 'source', unit: '', width: 80 },
  ], assumptionParameterMeta.map(m => {
    const v = getPath(input.assumptions.parameters, m.key)
    return { label: m.label, value: Array.isArray(v) ? v.join(' ') : (v as string | number | null) ?? '', unit: m.unit, source: m.source }
  }))

  return workbookBytes(wb)
}
