// The storm report as a workbook: Summary (caution, provenance, totals), Sites (ground-up and
// insured loss per site, one occurrence each; a blank with a note where the reader has no terms),
// Tanks (ranked, with the driving flash) and Flashes. Text that came from people is neutralised
// against formula injection by the sheet writer.
import { methodText, NO_TERMS_TEXT, NOT_COMPUTED_TEXT } from '../../shared/storms/report-text'
import type { StormReport } from './report'
import { addCautionSheet, addTableSheet, blankRow, decimalsFor, headingRow, newWorkbook, NUMBER_FORMATS, valueRow } from '../utils/sheets'
import { workbookBytes } from '../utils/downloads'

export async function writeStormWorkbook(report: StormReport, o: { exportedBy: string, publicUrl: string }): Promise<Buffer> {
  const wb = newWorkbook()
  const w = report.window
  const c = report.currency
  const MONEY = NUMBER_FORMATS.money
  const t = report.totals
  addCautionSheet(wb, {
    title: 'Stormledger storm report',
    rows: [
      valueRow('Reading', 'Probabilities computed from recorded flashes and the assumption set below; they rank which tanks to inspect first and are no finding that a tank was struck or burned.'),
      valueRow('Methodology', `${o.publicUrl}/methodology (Methodology §11)`),
      blankRow,
      valueRow('Expected fires (Σ P(fire)), fires', t.expectedFires, decimalsFor([t.expectedFires])),
      valueRow(`Expected ground-up loss, ${c}`, t.expectedGroundUpLoss, MONEY),
      { cells: [`Expected insured loss under current terms, ${c}`, t.sitesWithTerms ? t.expectedInsuredLoss : null, t.sitesWithTerms ? '' : 'blank: no site of this storm is under your terms'], numFmt: MONEY },
      valueRow(`Standard error of the insured loss, ${c} (Monte Carlo sites only; 0 when every site is exact)`, t.insuredSe, MONEY),
      valueRow('Sites reached, count', t.sites),
      valueRow('Sites under current terms, count', t.sitesWithTerms),
      valueRow('Sites with no terms (not in the insured total), count', t.sitesWithoutTerms),
      valueRow('Sites not computed per site (storm worked before per-site losses were kept), count', t.sitesNotComputed),
      valueRow('Tanks listed, count', report.tanks.length),
      blankRow,
      headingRow('Provenance'),
      valueRow('Storm window id', w.id), valueRow('Window starts (UTC)', w.startsAt), valueRow('Window ends (UTC)', w.endsAt), valueRow('Flash records, count', w.flashCount),
      valueRow('Assumption set', w.assumptions), valueRow('Engine version', w.engineVersion ?? ''), valueRow('Computed (UTC)', w.computedAt ?? ''),
      valueRow('Location error convention', 'location_error_km is σ per axis of a circular Gaussian error; records without one are taken as exact'),
      valueRow('Combination', 'flashes independent: P(at least one) = 1 − Π(1 − p)'),
      valueRow('Insured loss', 'all fires of one site in the window are one occurrence; tanks ignite independently with their P(fire), fire spreads to neighbours as in simulated years, each burning tank\'s damage follows the beta damage ratios; E[terms(Σ PD, Σ BI)] × share: occurrence deductible on PD, interruption deductible on BI, occurrence limit; never above min(value at risk, limit) × share; aggregate terms and layers not applied'),
      valueRow('Insured loss, how computed', 'exact where at most 4 tanks of the site can burn (every burning set enumerated, midpoint quadrature over each tank\'s damage), otherwise a seeded Monte Carlo of 40,000 draws with its standard error (Sites sheet, column Method)'),
      valueRow('Currency', c),
      valueRow('Exported by', o.exportedBy), valueRow('Exported (UTC)', new Date().toISOString()),
    ],
  })

  const probability = 'probability (0–1) in this storm'
  const siteProb = decimalsFor(report.siteLosses.map(x => x.probabilityOfFire))
  addTableSheet(wb, 'Sites', [
    { header: 'Site', key: 'site', unit: '', width: 26 }, { header: 'Site reference', key: 'ext', unit: '', width: 16 },
    { header: 'P(a fire at the site), probability', key: 'pFire', unit: probability, numFmt: siteProb },
    { header: `Expected ground-up loss, ${c}`, key: 'groundUp', unit: c, numFmt: MONEY },
    { header: `Value at risk, ${c}`, key: 'atRisk', unit: c, numFmt: MONEY },
    { header: `Expected insured loss, ${c}`, key: 'insured', unit: c, numFmt: MONEY },
    { header: `Standard error of the insured loss, ${c}`, key: 'se', unit: c, numFmt: MONEY },
    { header: `Insured loss at most, ${c}`, key: 'insuredAtRisk', unit: c, numFmt: MONEY },
    { header: 'Terms', key: 'terms', unit: '', width: 16 }, { header: 'Method', key: 'method', unit: '', width: 44 }, { header: 'Note', key: 'note', unit: '', width: 50 },
  ], report.siteLosses.map(x => ({
    site: x.siteName, ext: x.siteExternalId, pFire: x.probabilityOfFire, groundUp: x.expectedGroundUpLoss, atRisk: x.valueAtRisk,
    insured: x.terms === 'current' ? x.expectedInsuredLoss : null, se: x.terms === 'current' ? x.insuredSe : null, insuredAtRisk: x.insuredAtRisk,
    terms: x.terms === 'current' ? 'current terms' : x.terms === 'none' ? NO_TERMS_TEXT : 'not computed', method: methodText(x),
    note: x.terms === 'none' ? 'blank: you hold no terms on this site (not a loss of 0)' : x.terms === 'not computed' ? `blank: ${NOT_COMPUTED_TEXT}` : '',
  })))

  const prob = decimalsFor(report.tanks.flatMap(k => [k.ignition, k.direct, k.sparking, k.drivingIgnition, k.burning]))
  addTableSheet(wb, 'Tanks', [
    { header: 'Rank', key: 'rank', unit: '', numFmt: NUMBER_FORMATS.count, width: 6 },
    { header: 'Site', key: 'site', unit: '', width: 26 }, { header: 'Site reference', key: 'ext', unit: '', width: 16 }, { header: 'Tank', key: 'tag', unit: '', width: 12 },
    { header: 'P(fire), probability', key: 'ignition', unit: probability, numFmt: prob }, { header: 'P(direct strike), probability', key: 'direct', unit: probability, numFmt: prob },
    { header: 'P(induced spark), probability', key: 'sparking', unit: probability, numFmt: prob },
    { header: 'Driving flash, time (UTC)', key: 'flashTime', unit: 'ISO 8601, UTC', width: 24 }, { header: 'Driving flash, peak current, kA', key: 'flashCurrent', unit: 'kA', numFmt: '0.0' },
    { header: 'Driving flash, P(fire), probability', key: 'drivingIgnition', unit: probability, numFmt: prob },
    { header: 'P(burns, spread included), probability', key: 'burning', unit: probability, numFmt: prob },
    { header: `Expected ground-up loss, ${c}`, key: 'groundUp', unit: c, numFmt: MONEY },
  ], report.tanks.map((k, i) => ({
    rank: i + 1, site: k.siteName, ext: k.siteExternalId, tag: k.tag, ignition: k.ignition, direct: k.direct, sparking: k.sparking,
    flashTime: k.flashTime ?? '', flashCurrent: k.flashCurrentKa, drivingIgnition: k.drivingIgnition, burning: k.burning, groundUp: k.expectedGroundUpLoss,
  })))

  addTableSheet(wb, 'Flashes', [
    { header: 'Time (UTC)', key: 'time', unit: 'ISO 8601, UTC', width: 26 }, { header: 'Latitude, ° (WGS 84)', key: 'latDeg', unit: 'decimal degrees', numFmt: NUMBER_FORMATS.coordinate },
    { header: 'Longitude, ° (WGS 84)', key: 'lonDeg', unit: 'decimal degrees', numFmt: NUMBER_FORMATS.coordinate },
    { header: 'Peak current, kA', key: 'peakCurrentKa', unit: 'kA (signed)', numFmt: '0.0' }, { header: 'Type', key: 'type', unit: '', width: 8 },
    { header: 'Location error (σ), km', key: 'locationErrorKm', unit: 'km', numFmt: '0.00' },
  ], report.flashes.map(f => ({ ...f })))
  return workbookBytes(wb)
}
