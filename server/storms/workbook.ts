// The storm report as a workbook: Summary (caution, provenance, totals), Tanks (ranked, with the
// driving flash) and Flashes. Text that came from people is neutralised against formula injection.
import type { StormReport } from './report'
import { addCautionSheet, addTableSheet, blankRow, decimalsFor, headingRow, newWorkbook, NUMBER_FORMATS, valueRow } from '../utils/sheets'
import { workbookBytes } from '../utils/downloads'

export async function writeStormWorkbook(report: StormReport, o: { exportedBy: string, publicUrl: string }): Promise<Buffer> {
  const wb = newWorkbook()
  const w = report.window
  const c = report.currency
  const MONEY = NUMBER_FORMATS.money
  addCautionSheet(wb, {
    title: 'Stormledger storm report',
    rows: [
      valueRow('Reading', 'Probabilities computed from recorded flashes and the assumption set below; they rank which tanks to inspect first and are no finding that a tank was struck or burned.'),
      valueRow('Methodology', `${o.publicUrl}/methodology (Methodology §11)`),
      blankRow,
      valueRow('Expected fires (Σ P(fire)), fires', report.totals.expectedFires, decimalsFor([report.totals.expectedFires])),
      valueRow(`Expected ground-up loss, ${c}`, report.totals.expectedGroundUpLoss, MONEY),
      valueRow(`Expected insured loss under current terms, ${c}`, report.totals.expectedInsuredLoss, MONEY),
      valueRow('Tanks listed, count', report.tanks.length),
      blankRow,
      headingRow('Provenance'),
      valueRow('Storm window id', w.id), valueRow('Window starts (UTC)', w.startsAt), valueRow('Window ends (UTC)', w.endsAt), valueRow('Flash records, count', w.flashCount),
      valueRow('Assumption set', w.assumptions), valueRow('Engine version', w.engineVersion ?? ''), valueRow('Computed (UTC)', w.computedAt ?? ''),
      valueRow('Location error convention', 'location_error_km is σ per axis of a circular Gaussian error; records without one are taken as exact'),
      valueRow('Combination', 'flashes independent: P(at least one) = 1 − Π(1 − p)'),
      valueRow('Insured loss', 'each fire as one occurrence: per-occurrence deductible, interruption deductible and limit, then the share, on the fire\'s expected loss; aggregate terms and layers not applied'),
      valueRow('Currency', c),
      valueRow('Exported by', o.exportedBy), valueRow('Exported (UTC)', new Date().toISOString()),
    ],
  })

  const prob = decimalsFor(report.tanks.flatMap(t => [t.ignition, t.direct, t.sparking, t.drivingIgnition]))
  const probability = 'probability (0–1) in this storm'
  addTableSheet(wb, 'Tanks', [
    { header: 'Rank', key: 'rank', unit: '', numFmt: NUMBER_FORMATS.count, width: 6 },
    { header: 'Site', key: 'site', unit: '', width: 26 }, { header: 'Site reference', key: 'ext', unit: '', width: 16 }, { header: 'Tank', key: 'tag', unit: '', width: 12 },
    { header: 'P(fire), probability', key: 'ignition', unit: probability, numFmt: prob }, { header: 'P(direct strike), probability', key: 'direct', unit: probability, numFmt: prob },
    { header: 'P(induced spark), probability', key: 'sparking', unit: probability, numFmt: prob },
    { header: 'Driving flash, time (UTC)', key: 'flashTime', unit: 'ISO 8601, UTC', width: 24 }, { header: 'Driving flash, peak current, kA', key: 'flashCurrent', unit: 'kA', numFmt: '0.0' },
    { header: 'Driving flash, P(fire), probability', key: 'drivingIgnition', unit: probability, numFmt: prob },
    { header: `Expected ground-up loss, ${c}`, key: 'groundUp', unit: c, numFmt: MONEY },
    { header: `Expected insured loss, ${c}`, key: 'insured', unit: c, numFmt: MONEY },
    { header: 'Terms', key: 'terms', unit: '', width: 14 },
  ], report.tanks.map((t, i) => ({
    rank: i + 1, site: t.siteName, ext: t.siteExternalId, tag: t.tag, ignition: t.ignition, direct: t.direct, sparking: t.sparking,
    flashTime: t.flashTime ?? '', flashCurrent: t.flashCurrentKa, drivingIgnition: t.drivingIgnition, groundUp: t.expectedGroundUpLoss,
    insured: t.expectedInsuredLoss, terms: t.hasTerms ? 'current terms' : 'no terms',
  })))

  addTableSheet(wb, 'Flashes', [
    { header: 'Time (UTC)', key: 'time', unit: 'ISO 8601, UTC', width: 26 }, { header: 'Latitude, ° (WGS 84)', key: 'latDeg', unit: 'decimal degrees', numFmt: NUMBER_FORMATS.coordinate },
    { header: 'Longitude, ° (WGS 84)', key: 'lonDeg', unit: 'decimal degrees', numFmt: NUMBER_FORMATS.coordinate },
    { header: 'Peak current, kA', key: 'peakCurrentKa', unit: 'kA (signed)', numFmt: '0.0' }, { header: 'Type', key: 'type', unit: '', width: 8 },
    { header: 'Location error (σ), km', key: 'locationErrorKm', unit: 'km', numFmt: '0.00' },
  ], report.flashes.map(f => ({ ...f })))
  return workbookBytes(wb)
}
