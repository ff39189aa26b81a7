// The storm report as a workbook: Summary (caution, provenance, totals), Sites (ground-up and
// insured loss per site, one occurrence each; a blank with a note where the reader has no terms),
// Tanks (ranked, with the driving flash) and Flashes. Text that came from people is neutralised
// against formula injection.
import ExcelJS from 'exceljs'
import { CAUTION_FULL } from '../../shared/caution'
import { neutraliseFormula } from '../../shared/csv'
import { methodText, NO_TERMS_TEXT, NOT_COMPUTED_TEXT } from '../../shared/storms/report-text'
import type { StormReport } from './report'

const text = (v: string | null | undefined) => (v ? neutraliseFormula(v) : '')
const PROB = '0.000E+00'

function table(ws: ExcelJS.Worksheet, columns: { header: string, key: string, width: number, numFmt?: string }[], rows: Record<string, unknown>[]) {
  ws.columns = columns.map(c => ({ header: c.header, key: c.key, width: c.width, style: c.numFmt ? { numFmt: c.numFmt } : {} }))
  ws.addRows(rows)
  ws.getRow(1).font = { bold: true }
  ws.views = [{ state: 'frozen', ySplit: 1 }]
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } }
}

export async function writeStormWorkbook(report: StormReport, o: { exportedBy: string, publicUrl: string }): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Stormledger'
  const summary = wb.addWorksheet('Summary')
  summary.getColumn(1).width = 46
  summary.getColumn(2).width = 60
  const w = report.window
  const c = report.currency
  const rows: (string | number | null)[][] = [
    ['Stormledger storm report'],
    ['Caution', CAUTION_FULL],
    ['Reading', 'Probabilities computed from recorded flashes and the assumption set below; they rank which tanks to inspect first and are no finding that a tank was struck or burned.'],
    ['Methodology', `${o.publicUrl}/methodology`],
    [],
    ['Expected fires (Σ P(ignition))', report.totals.expectedFires],
    [`Expected ground-up loss (${c})`, report.totals.expectedGroundUpLoss],
    [`Expected insured loss under current terms (${c})`, report.totals.sitesWithTerms ? report.totals.expectedInsuredLoss : null],
    [`Standard error of the insured loss (${c}; Monte Carlo sites only, 0 when all exact)`, report.totals.insuredSe],
    ['Sites reached', report.totals.sites],
    ['Sites under current terms', report.totals.sitesWithTerms],
    ['Sites with no terms (not in the insured total)', report.totals.sitesWithoutTerms],
    ['Sites not computed per site (storm worked before per-site losses were kept)', report.totals.sitesNotComputed],
    ['Tanks listed', report.tanks.length],
    [],
    ['Provenance'],
    ['Storm window id', w.id], ['Window starts (UTC)', w.startsAt], ['Window ends (UTC)', w.endsAt], ['Flash records', w.flashCount],
    ['Assumption set', text(w.assumptions)], ['Engine version', w.engineVersion ?? ''], ['Computed', w.computedAt ?? ''],
    ['Location error convention', 'location_error_km is σ per axis of a circular Gaussian error; records without one are taken as exact'],
    ['Combination', 'flashes independent: P(at least one) = 1 − Π(1 − p)'],
    ['Insured loss', 'all fires of one site in the window are one occurrence; tanks ignite independently with their P(fire), fire spreads to neighbours as in year mode, each burning tank\'s damage follows the beta damage ratios; E[terms(Σ PD, Σ BI)] × share: occurrence deductible on PD, interruption deductible on BI, occurrence limit; never above min(value at risk, limit) × share; aggregate terms and layers not applied'],
    ['Insured loss, how computed', 'exact where at most 4 tanks of the site can burn (every burning set enumerated, midpoint quadrature over each tank\'s damage), otherwise a seeded Monte Carlo of 40,000 draws with its standard error (Sites sheet, column method)'],
    ['Exported by', text(o.exportedBy)], ['Exported', new Date().toISOString()],
  ]
  rows.forEach((r, i) => r.forEach((v, j) => { summary.getCell(i + 1, j + 1).value = v }))
  summary.getCell(1, 1).font = { bold: true, size: 14 }
  summary.getCell(2, 2).alignment = { wrapText: true }
  for (const r of [7, 8, 9]) summary.getCell(r, 2).numFmt = '#,##0'
  if (!report.totals.sitesWithTerms) summary.getCell(8, 3).value = 'blank: no site of this storm is under your terms'

  const sitesSheet = wb.addWorksheet('Sites')
  table(sitesSheet, [
    { header: 'site', key: 'site', width: 26 }, { header: 'site_external_id', key: 'ext', width: 16 },
    { header: 'p_fire_at_site', key: 'pFire', width: 14, numFmt: PROB },
    { header: `expected_ground_up_loss_${c}`, key: 'groundUp', width: 20, numFmt: '#,##0' },
    { header: `value_at_risk_${c}`, key: 'atRisk', width: 18, numFmt: '#,##0' },
    { header: `expected_insured_loss_${c}`, key: 'insured', width: 20, numFmt: '#,##0' },
    { header: `insured_standard_error_${c}`, key: 'se', width: 18, numFmt: '#,##0' },
    { header: `insured_at_most_${c}`, key: 'insuredAtRisk', width: 18, numFmt: '#,##0' },
    { header: 'terms', key: 'terms', width: 16 }, { header: 'method', key: 'method', width: 44 }, { header: 'note', key: 'note', width: 50 },
  ], report.siteLosses.map(x => ({
    site: text(x.siteName), ext: text(x.siteExternalId), pFire: x.probabilityOfFire, groundUp: x.expectedGroundUpLoss, atRisk: x.valueAtRisk,
    insured: x.terms === 'current' ? x.expectedInsuredLoss : null, se: x.terms === 'current' ? x.insuredSe : null, insuredAtRisk: x.insuredAtRisk,
    terms: x.terms === 'current' ? 'current terms' : x.terms === 'none' ? NO_TERMS_TEXT : 'not computed', method: methodText(x),
    note: x.terms === 'none' ? 'blank: you hold no terms on this site (not a loss of 0)' : x.terms === 'not computed' ? `blank: ${NOT_COMPUTED_TEXT}` : '',
  })))

  table(wb.addWorksheet('Tanks'), [
    { header: 'rank', key: 'rank', width: 6 },
    { header: 'site', key: 'site', width: 26 }, { header: 'site_external_id', key: 'ext', width: 16 }, { header: 'tank', key: 'tag', width: 12 },
    { header: 'p_fire', key: 'ignition', width: 12, numFmt: PROB }, { header: 'p_direct_strike', key: 'direct', width: 14, numFmt: PROB },
    { header: 'p_induced_spark', key: 'sparking', width: 14, numFmt: PROB },
    { header: 'driving_flash_time_utc', key: 'flashTime', width: 24 }, { header: 'driving_flash_peak_current_ka', key: 'flashCurrent', width: 14 },
    { header: 'driving_flash_p_fire', key: 'drivingIgnition', width: 14, numFmt: PROB },
    { header: 'p_burns_spread_included', key: 'burning', width: 14, numFmt: PROB },
    { header: `expected_ground_up_loss_${c}`, key: 'groundUp', width: 18, numFmt: '#,##0' },
  ], report.tanks.map((t, i) => ({
    rank: i + 1, site: text(t.siteName), ext: text(t.siteExternalId), tag: text(t.tag), ignition: t.ignition, direct: t.direct, sparking: t.sparking,
    flashTime: t.flashTime ?? '', flashCurrent: t.flashCurrentKa, drivingIgnition: t.drivingIgnition, burning: t.burning, groundUp: t.expectedGroundUpLoss,
  })))

  table(wb.addWorksheet('Flashes'), [
    { header: 'time_utc', key: 'time', width: 26 }, { header: 'latitude', key: 'latDeg', width: 12 }, { header: 'longitude', key: 'lonDeg', width: 12 },
    { header: 'peak_current_ka', key: 'peakCurrentKa', width: 14 }, { header: 'type', key: 'type', width: 8 }, { header: 'location_error_km', key: 'locationErrorKm', width: 16 },
  ], report.flashes.map(f => ({ ...f })))
  return Buffer.from(await wb.xlsx.writeBuffer())
}
