// The storm report as a workbook: Summary (caution, provenance, totals), Tanks (ranked, with the
// driving flash) and Flashes. Text that came from people is neutralised against formula injection.
import ExcelJS from 'exceljs'
import { CAUTION_FULL } from '../../shared/caution'
import { neutraliseFormula } from '../../shared/csv'
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
    [`Expected insured loss under current terms (${c})`, report.totals.expectedInsuredLoss],
    ['Tanks listed', report.tanks.length],
    [],
    ['Provenance'],
    ['Storm window id', w.id], ['Window starts (UTC)', w.startsAt], ['Window ends (UTC)', w.endsAt], ['Flash records', w.flashCount],
    ['Assumption set', text(w.assumptions)], ['Engine version', w.engineVersion ?? ''], ['Computed', w.computedAt ?? ''],
    ['Location error convention', 'location_error_km is σ per axis of a circular Gaussian error; records without one are taken as exact'],
    ['Combination', 'flashes independent: P(at least one) = 1 − Π(1 − p)'],
    ['Insured loss', 'each fire as one occurrence: per-occurrence deductible, interruption deductible and limit, then the share, on the fire\'s expected loss; aggregate terms and layers not applied'],
    ['Exported by', text(o.exportedBy)], ['Exported', new Date().toISOString()],
  ]
  rows.forEach((r, i) => r.forEach((v, j) => { summary.getCell(i + 1, j + 1).value = v }))
  summary.getCell(1, 1).font = { bold: true, size: 14 }
  summary.getCell(2, 2).alignment = { wrapText: true }
  for (const r of [7, 8]) summary.getCell(r, 2).numFmt = '#,##0'

  table(wb.addWorksheet('Tanks'), [
    { header: 'rank', key: 'rank', width: 6 },
    { header: 'site', key: 'site', width: 26 }, { header: 'site_external_id', key: 'ext', width: 16 }, { header: 'tank', key: 'tag', width: 12 },
    { header: 'p_fire', key: 'ignition', width: 12, numFmt: PROB }, { header: 'p_direct_strike', key: 'direct', width: 14, numFmt: PROB },
    { header: 'p_induced_spark', key: 'sparking', width: 14, numFmt: PROB },
    { header: 'driving_flash_time_utc', key: 'flashTime', width: 24 }, { header: 'driving_flash_peak_current_ka', key: 'flashCurrent', width: 14 },
    { header: 'driving_flash_p_fire', key: 'drivingIgnition', width: 14, numFmt: PROB },
    { header: `expected_ground_up_loss_${c}`, key: 'groundUp', width: 18, numFmt: '#,##0' },
    { header: `expected_insured_loss_${c}`, key: 'insured', width: 18, numFmt: '#,##0' },
    { header: 'terms', key: 'terms', width: 14 },
  ], report.tanks.map((t, i) => ({
    rank: i + 1, site: text(t.siteName), ext: text(t.siteExternalId), tag: text(t.tag), ignition: t.ignition, direct: t.direct, sparking: t.sparking,
    flashTime: t.flashTime ?? '', flashCurrent: t.flashCurrentKa, drivingIgnition: t.drivingIgnition, groundUp: t.expectedGroundUpLoss,
    insured: t.expectedInsuredLoss, terms: t.hasTerms ? 'current terms' : 'no terms',
  })))

  table(wb.addWorksheet('Flashes'), [
    { header: 'time_utc', key: 'time', width: 26 }, { header: 'latitude', key: 'latDeg', width: 12 }, { header: 'longitude', key: 'lonDeg', width: 12 },
    { header: 'peak_current_ka', key: 'peakCurrentKa', width: 14 }, { header: 'type', key: 'type', width: 8 }, { header: 'location_error_km', key: 'locationErrorKm', width: 16 },
  ], report.flashes.map(f => ({ ...f })))
  return Buffer.from(await wb.xlsx.writeBuffer())
}
