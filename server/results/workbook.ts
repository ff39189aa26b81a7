// The results workbook of a run: Summary (headline figures, cautions, provenance), Sites, Tanks,
// Exceedance, Assumptions — units in headers, number formats, frozen headers and filters. Text that
// came from people is neutralised so a spreadsheet cannot run it as a formula.
import ExcelJS from 'exceljs'
import { assumptionParameterMeta } from '../../shared/engine/assumptions'
import { CAUTION_FULL } from '../../shared/caution'
import { neutraliseFormula } from '../../shared/csv'
import { getPath } from '../../shared/paths'
import { formatMoneyRange, formatRange, formatUpperBound } from '../../shared/format'
import type { runPortfolioResults, runs, runTankResults } from '../db/schema'
import type { siteResults, StoredYearSummary } from './queries'
import { workbookBytes } from '../utils/downloads'

const text = (v: string | null | undefined) => (v ? neutraliseFormula(v) : '')
const FREQ = '0.000E+00'

export interface WorkbookInput {
  run: typeof runs.$inferSelect
  portfolio: typeof runPortfolioResults.$inferSelect
  sites: Awaited<ReturnType<typeof siteResults>>
  tanks: (typeof runTankResults.$inferSelect)[]
  assumptions: { setName: string, version: number, parameters: unknown }
  requestedBy: string | null
  exportedBy: string
  currency: string
  publicUrl: string
}

function table(ws: ExcelJS.Worksheet, columns: { header: string, key: string, width: number, numFmt?: string }[], rows: Record<string, unknown>[]) {
  ws.columns = columns.map(c => ({ header: c.header, key: c.key, width: c.width, style: c.numFmt ? { numFmt: c.numFmt } : {} }))
  ws.addRows(rows)
  ws.getRow(1).font = { bold: true }
  ws.views = [{ state: 'frozen', ySplit: 1 }]
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } }
}

export async function writeResultsWorkbook(input: WorkbookInput): Promise<Buffer> {
  const { run, portfolio: p, currency } = input
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Stormledger'
  const summary = wb.addWorksheet('Summary')
  summary.getColumn(1).width = 44
  summary.getColumn(2).width = 22
  summary.getColumn(3).width = 22
  summary.getColumn(4).width = 22
  summary.getColumn(5).width = 34
  const ys = p.yearSummary as StoredYearSummary | null
  const rows: (string | number | null)[][] = [
    ['Stormledger results workbook'],
    ['Caution', CAUTION_FULL],
    ['Methodology', `${input.publicUrl}/methodology`],
    [],
    ['Figure', 'Estimate', '95 % low', '95 % high', '95 % interval (as printed)'],
    ['Expected fires (/yr)', p.ignitionRate, p.ignitionLo, p.ignitionHi, `${formatRange(p.ignitionLo, p.ignitionHi, 2, undefined, p.ignitionRate)} /yr`],
    ['Induced sparking (/yr)', p.sparkingRate, p.sparkingLo, p.sparkingHi, `${formatRange(p.sparkingLo, p.sparkingHi, 2, undefined, p.sparkingRate)} /yr`],
    ['Direct strikes on tanks (/yr)', p.directRate, p.directLo, p.directHi, `${formatRange(p.directLo, p.directHi, 2, undefined, p.directRate)} /yr`],
    [`Average annual loss (${currency}/yr)`, p.expectedAnnualLoss, p.expectedAnnualLossLo, p.expectedAnnualLossHi, formatMoneyRange(p.expectedAnnualLossLo, p.expectedAnnualLossHi, currency)],
  ]
  for (const T of [100, 250]) {
    const row = ys?.aggregate.find(r => r.returnPeriodYears === T)
    const iv = ys?.intervals?.aggregate.find(r => r.returnPeriodYears === T)
    rows.push([`Aggregate loss at ${T} years (${currency})`, row?.loss ?? null, iv?.lo ?? null, iv?.hi ?? null])
  }
  const tail = ys?.aggregate.find(r => r.returnPeriodYears === 250)?.tailValueAtRisk ?? null
  rows.push([`Tail value-at-risk at 250 years (${currency})`, tail, null, null])
  const hasSplit = p.expectedAnnualLossPd !== null && p.expectedAnnualLossBi !== null
  rows.push([`Average annual loss, property damage (${currency}/yr)`, hasSplit ? p.expectedAnnualLossPd : 'total only (run made before the split)', null, null])
  rows.push([`Average annual loss, business interruption (${currency}/yr)`, hasSplit ? p.expectedAnnualLossBi : 'total only (run made before the split)', null, null])
  rows.push([], ['Provenance'],
    ['Run id', run.id], ['Portfolio', text(run.portfolioName)], ['Mode', run.mode === 'year' ? `simulated years (${run.years} per site)` : `frequency (target relative standard error ${run.targetRse}; negligible-rate rule ${run.negligibleRatePerYear > 0 ? `${run.negligibleRatePerYear} /yr` : 'off'})`],
    ['Seed', run.seed], ['Engine version', run.engineVersion], ['Assumption set', `${text(input.assumptions.setName)} — version ${input.assumptions.version}`],
    ['Input hash (sha-256)', run.inputHash], ['Started by', text(input.requestedBy ?? '—')], ['Created', run.createdAt.toISOString()],
    ['Finished', run.finishedAt?.toISOString() ?? ''], ['Exported by', text(input.exportedBy)], ['Exported', new Date().toISOString()])
  rows.forEach((r, i) => r.forEach((v, j) => { summary.getCell(i + 1, j + 1).value = v }))
  summary.getCell(1, 1).font = { bold: true, size: 14 }
  summary.getRow(5).font = { bold: true }
  summary.getCell(2, 2).alignment = { wrapText: true }
  for (let r = 6; r <= 8; r++) for (let c = 2; c <= 4; c++) summary.getCell(r, c).numFmt = FREQ
  for (let r = 9; r <= 14; r++) for (let c = 2; c <= 4; c++) summary.getCell(r, c).numFmt = '#,##0'

  table(wb.addWorksheet('Sites'), [
    { header: 'site', key: 'name', width: 30 }, { header: 'external_id', key: 'externalId', width: 14 }, { header: 'operator', key: 'operator', width: 24 },
    { header: 'latitude_deg', key: 'lat', width: 12, numFmt: '0.0000' }, { header: 'longitude_deg', key: 'lon', width: 13, numFmt: '0.0000' },
    { header: 'tanks', key: 'tanks', width: 8 }, { header: 'simulated_radius_m', key: 'radius', width: 18, numFmt: '0' },
    { header: 'expected_fires_per_yr', key: 'ign', width: 20, numFmt: FREQ }, { header: 'expected_fires_lo', key: 'ignLo', width: 17, numFmt: FREQ }, { header: 'expected_fires_hi', key: 'ignHi', width: 17, numFmt: FREQ },
    { header: 'sparking_per_yr', key: 'spk', width: 16, numFmt: FREQ }, { header: 'direct_strikes_per_yr', key: 'dir', width: 20, numFmt: FREQ },
    { header: `average_annual_loss_${currency}_per_yr`, key: 'eal', width: 26, numFmt: '#,##0' },
    { header: `property_damage_${currency}_per_yr`, key: 'pd', width: 24, numFmt: '#,##0' }, { header: `business_interruption_${currency}_per_yr`, key: 'bi', width: 28, numFmt: '#,##0' },
    { header: `loss_at_100_years_${currency}`, key: 'l100', width: 22, numFmt: '#,##0' },
  ], input.sites.map(s => ({
    pd: s.expectedAnnualLossPd, bi: s.expectedAnnualLossBi,
    name: text(s.facts.name), externalId: text(s.facts.externalId), operator: text(s.facts.operatorName), lat: s.facts.latitudeDeg, lon: s.facts.longitudeDeg,
    tanks: s.tanks, radius: s.radiusM, ign: s.ignitionRate, ignLo: s.ignitionLo, ignHi: s.ignitionHi, spk: s.sparkingRate, dir: s.directRate, eal: s.expectedAnnualLoss, l100: s.lossAt100,
  })))

  const siteName = new Map(input.sites.map(s => [s.siteId, s.facts.name]))
  table(wb.addWorksheet('Tanks'), [
    { header: 'site', key: 'site', width: 30 }, { header: 'tank', key: 'tag', width: 12 },
    { header: 'expected_fires_per_yr', key: 'ign', width: 20, numFmt: FREQ }, { header: 'expected_fires_lo', key: 'ignLo', width: 17, numFmt: FREQ }, { header: 'expected_fires_hi', key: 'ignHi', width: 17, numFmt: FREQ },
    { header: 'sparking_per_yr', key: 'spk', width: 16, numFmt: FREQ }, { header: 'sparking_lo', key: 'spkLo', width: 14, numFmt: FREQ }, { header: 'sparking_hi', key: 'spkHi', width: 14, numFmt: FREQ },
    { header: 'direct_strikes_per_yr', key: 'dir', width: 20, numFmt: FREQ },
    { header: `expected_annual_loss_${currency}_per_yr`, key: 'eal', width: 26, numFmt: '#,##0' },
    { header: `property_damage_${currency}_per_yr`, key: 'pd', width: 24, numFmt: '#,##0' }, { header: `business_interruption_${currency}_per_yr`, key: 'bi', width: 28, numFmt: '#,##0' },
    { header: 'driving_component_class', key: 'cls', width: 24 }, { header: 'samples', key: 'samples', width: 12 },
    { header: 'upper_bound_only', key: 'bound', width: 30 },
    { header: 'expected_fires_95_interval_per_yr', key: 'ignText', width: 30 },
    { header: 'direct_strikes_count', key: 'dirN', width: 20 }, { header: 'sparking_count', key: 'spkN', width: 16 }, { header: 'expected_fires_count', key: 'ignN', width: 20 },
  ], input.tanks.map((t) => {
    // A figure stopped by the negligible-rate rule has no lower end: its "hi" is an upper bound.
    const bound = (name: string) => t.upperBoundFigures.includes(name)
    return {
      pd: t.expectedAnnualLossPd, bi: t.expectedAnnualLossBi,
      site: text(siteName.get(t.siteId)), tag: text(t.tag), ign: t.ignitionRate, ignLo: bound('ignition') ? null : t.ignitionLo, ignHi: t.ignitionHi,
      spk: t.sparkingRate, spkLo: bound('sparking') ? null : t.sparkingLo, spkHi: t.sparkingHi, dir: t.directRate, eal: t.expectedAnnualLoss, cls: t.drivingComponentClass ?? '', samples: t.samples,
      bound: t.upperBoundFigures.length > 0 ? `${t.upperBoundFigures.join(', ')} (negligible: hi is an upper bound)` : '',
      ignText: bound('ignition') ? formatUpperBound(t.ignitionHi) : formatRange(t.ignitionLo, t.ignitionHi, 2, undefined, t.ignitionRate),
      dirN: t.directCount, spkN: t.sparkingCount, ignN: t.ignitionCount,
    }
  }))

  const exceedance = wb.addWorksheet('Exceedance')
  if (ys) {
    table(exceedance, [
      { header: 'return_period_years', key: 'T', width: 20 }, { header: `aggregate_loss_${currency}`, key: 'agg', width: 22, numFmt: '#,##0' },
      { header: 'aggregate_lo', key: 'aggLo', width: 16, numFmt: '#,##0' }, { header: 'aggregate_hi', key: 'aggHi', width: 16, numFmt: '#,##0' },
      { header: `occurrence_loss_${currency}`, key: 'occ', width: 22, numFmt: '#,##0' }, { header: `tail_value_at_risk_${currency}`, key: 'tvar', width: 24, numFmt: '#,##0' },
    ], ys.aggregate.map((r, k) => ({
      T: r.returnPeriodYears, agg: r.loss, aggLo: ys.intervals?.aggregate[k]?.lo ?? null, aggHi: ys.intervals?.aggregate[k]?.hi ?? null,
      occ: ys.occurrence[k]?.loss ?? null, tvar: r.tailValueAtRisk,
    })))
  } else {
    exceedance.getCell(1, 1).value = 'Exceedance tables come from simulated-years runs; this run estimated frequencies.'
  }

  table(wb.addWorksheet('Assumptions'), [
    { header: 'parameter', key: 'label', width: 60 }, { header: 'value', key: 'value', width: 18 }, { header: 'unit', key: 'unit', width: 16 }, { header: 'source', key: 'source', width: 80 },
  ], assumptionParameterMeta.map(m => {
    const v = getPath(input.assumptions.parameters, m.key)
    return { label: m.label, value: Array.isArray(v) ? v.join(' ') : (v as string | number | null) ?? '', unit: m.unit, source: m.source }
  }))

  return workbookBytes(wb)
}
