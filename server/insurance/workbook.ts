// The financial workbook of a run: Summary (cautions, provenance, pricing basis, headline figures),
// Sites, Premium, Exceedance, Layers and Largest events, property damage (PD) and business
// interruption (BI) beside every total. Every text cell that a person or the inventory supplied is written
// so that a spreadsheet cannot run it as a formula.
import { CAUTION_TEXT } from '../../shared/caution'
import { riskLoadLabels } from '../../shared/insurance/pricing'
import type { FinancialView } from './financial-view'
import { addCautionSheet, addTableSheet, newWorkbook, NUMBER_FORMATS, valueRow, type CellValue, type SheetColumn } from '../utils/sheets'
import { workbookBytes } from '../utils/downloads'

export interface WorkbookContext { currency: string, exportedBy: string, exportedAt: Date }

const MONEY = NUMBER_FORMATS.money
const SHARE = NUMBER_FORMATS.share
/** Column helpers: money in the currency, shares on [0, 1] as per cent, plain text. */
const money = (header: string, key: string, unit: string): SheetColumn => ({ header, key, unit, numFmt: MONEY })
const share = (header: string, key: string): SheetColumn => ({ header, key, unit: 'share (0–1), shown as %', numFmt: SHARE })
const label = (header: string, key: string, width?: number): SheetColumn => ({ header, key, unit: '', width })
/** Rows from arrays in column order (the sheets below list their cells positionally). */
const byColumn = (columns: SheetColumn[], cells: CellValue[]) => Object.fromEntries(columns.map((col, i) => [col.key, cells[i]]))

export async function writeFinancialWorkbook(view: FinancialView, ctx: WorkbookContext): Promise<Buffer> {
  const workbook = newWorkbook()
  const c = ctx.currency
  const rows: [string, CellValue, string?][] = [
    ['', CAUTION_TEXT.long],
    ['', 'Insured figures apply the policy terms below to simulated loss events; they support pricing and do not replace an underwriter\'s judgement.'],
    ['Run id', view.run.id],
    ['Portfolio', view.run.portfolioName],
    ['Seed', view.run.seed],
    ['Engine version', view.run.engineVersion],
    ['Assumption-set version', `${view.run.assumptions.setName} — version ${view.run.assumptions.version} (${view.run.assumptions.versionId})`],
    ['Terms version', view.terms ? `${view.terms.setName} — version ${view.terms.version} (${view.terms.versionId})${view.terms.recordedByRun ? '' : ', not the version the run recorded'}` : 'No terms: insured = ground-up'],
    ['Input hash (sha-256)', view.run.inputHash],
    ['Simulated years per site, count', view.run.years],
    ['Run started by', view.run.requestedBy],
    ['Run finished', view.run.finishedAt ? new Date(view.run.finishedAt).toISOString() : null],
    ['Exported by', ctx.exportedBy],
    ['Exported at', ctx.exportedAt.toISOString()],
    ['Currency', c],
    ['Risk load', riskLoadLabels[view.pricing.method]],
    ['Risk-load factor', view.pricing.factor],
    ['Tail return period, years', view.pricing.returnPeriodYears],
    ['Expense loading, share of premium (%)', view.pricing.expenseRatio, SHARE],
    ['Profit loading, share of premium (%)', view.pricing.profitRatio, SHARE],
    [`Average annual loss (AAL), ground-up, ${c}/yr`, view.portfolio.groundUp.averageAnnualLoss, MONEY],
    [`Average annual loss (AAL), after terms, ${c}/yr`, view.portfolio.afterTerms.averageAnnualLoss, MONEY],
    [`Average annual loss (AAL), insurer's share, ${c}/yr`, view.portfolio.insured.averageAnnualLoss, MONEY],
    [`Insured loss at ${view.portfolio.tailReturnPeriodYears} years, ${c}`, view.portfolio.insuredLossAtTail, MONEY],
    [`Insured tail value-at-risk at ${view.portfolio.tailReturnPeriodYears} years, ${c}`, view.portfolio.insuredTailValueAtRisk, MONEY],
    [`Technical premium, total, ${c}/yr`, view.portfolio.premium.premium, MONEY],
    ['Sites without terms', view.sitesWithoutTerms],
    ['Property damage / interruption split', view.hasSplit ? 'yes: PD = replacement + contents + clean-up, BI = interruption' : 'total only: the run was made before the split (engine 1); every loss is counted as property damage'],
    [`Average annual loss (AAL), ground-up, PD, ${c}/yr`, view.portfolio.propertyDamage.groundUp.averageAnnualLoss, MONEY],
    [`Average annual loss (AAL), ground-up, BI, ${c}/yr`, view.portfolio.businessInterruption.groundUp.averageAnnualLoss, MONEY],
    [`Average annual loss (AAL), insurer's share, PD, ${c}/yr`, view.portfolio.propertyDamage.insured.averageAnnualLoss, MONEY],
    [`Average annual loss (AAL), insurer's share, BI, ${c}/yr`, view.portfolio.businessInterruption.insured.averageAnnualLoss, MONEY],
    [`Technical premium, PD, ${c}/yr`, view.portfolio.premiumSplit.propertyDamage.premium, MONEY],
    [`Technical premium, BI, ${c}/yr`, view.portfolio.premiumSplit.businessInterruption.premium, MONEY],
  ]
  addCautionSheet(workbook, { title: 'Stormledger — financial results of a run', caution: CAUTION_TEXT.short, rows: rows.map(([l, v, f]) => valueRow(l, v, f)) })

  const perYr = `${c} per year`
  const siteColumns: SheetColumn[] = [
    label('Site reference', 'ext'), label('Site', 'name', 30), label('Operator', 'operator', 24), label('Has terms', 'hasTerms'),
    money(`Occurrence deductible, ${c}`, 'occDed', c), money(`Occurrence limit, ${c}`, 'occLim', c), money(`Aggregate deductible, ${c}`, 'aggDed', c), money(`Aggregate limit, ${c}`, 'aggLim', c),
    money(`Interruption deductible (waiting period), ${c}`, 'biDed', c), share('Insurer\'s share, %', 'share'),
    money(`AAL, ground-up, ${c}/yr`, 'aalGu', perYr), money(`AAL, after terms, ${c}/yr`, 'aalAt', perYr), money(`AAL, insured, ${c}/yr`, 'aalIns', perYr),
    money(`AAL, ground-up, PD, ${c}/yr`, 'aalGuPd', perYr), money(`AAL, ground-up, BI, ${c}/yr`, 'aalGuBi', perYr), money(`AAL, insured, PD, ${c}/yr`, 'aalInsPd', perYr), money(`AAL, insured, BI, ${c}/yr`, 'aalInsBi', perYr),
    share('Share of years with a loss, %', 'lossYears'), share('Share of years deductible reached, %', 'dedYears'),
    money(`Insured loss at the tail return period, ${c}`, 'insTail', c), money(`Loss in the portfolio's tail years, ${c}`, 'tailLoss', c), money(`Tail value-at-risk contribution, ${c}`, 'tvarContribution', c),
    share('Share of the portfolio\'s tail value-at-risk, %', 'tvarShare'),
  ]
  addTableSheet(workbook, 'Sites', siteColumns, view.sites.map(s => byColumn(siteColumns, [s.externalId, s.name, s.operatorName, s.hasTerms ? 'yes' : 'no', s.terms.occurrenceDeductible, s.terms.occurrenceLimit, s.terms.aggregateDeductible, s.terms.aggregateLimit, s.terms.interruptionDeductible, s.terms.share,
    s.averageAnnualLoss.groundUp, s.averageAnnualLoss.afterTerms, s.averageAnnualLoss.insured,
    s.averageAnnualLossSplit.propertyDamage.groundUp, s.averageAnnualLossSplit.businessInterruption.groundUp,
    s.averageAnnualLossSplit.propertyDamage.insured, s.averageAnnualLossSplit.businessInterruption.insured, s.lossYearShare, s.deductibleReachedShare,
    s.insuredLossAtReturnPeriod, s.tail.lossContribution, s.tail.tailValueAtRiskContribution, s.tail.shareOfTailValueAtRisk])))

  const premiumColumns: SheetColumn[] = [
    label('Site reference', 'ext'), label('Site', 'name', 30), label('Part (total, PD, BI)', 'part'),
    money(`Expected insured loss, ${c}/yr`, 'expectedLoss', perYr), money(`Risk measure, ${c}`, 'riskMeasure', c), money(`Risk load, ${c}/yr`, 'riskLoad', perYr),
    money(`Expenses, ${c}/yr`, 'expenses', perYr), money(`Profit, ${c}/yr`, 'profit', perYr), money(`Technical premium, ${c}/yr`, 'premium', perYr),
  ]
  type Lines = typeof view.portfolio.premium
  const premiumRows: Record<string, CellValue>[] = []
  const addPremium = (id: string, name: string, total: Lines, split: { propertyDamage: Lines, businessInterruption: Lines }) => {
    for (const [part, p] of [['total', total], ['PD', split.propertyDamage], ['BI', split.businessInterruption]] as const) {
      premiumRows.push(byColumn(premiumColumns, [id, name, part, p.expectedLoss, p.riskMeasure, p.riskLoad, p.expenses, p.profit, p.premium]))
    }
  }
  for (const s of view.sites) addPremium(s.externalId, s.name, s.premium, s.premiumSplit)
  addPremium('', 'Total', view.portfolio.premium, view.portfolio.premiumSplit)
  const premium = addTableSheet(workbook, 'Premium', premiumColumns, premiumRows)
  premium.getRow(premium.rowCount - 2).font = { bold: true }

  const exceedanceColumns: SheetColumn[] = [
    { header: 'Return period, years', key: 'T', unit: 'years', numFmt: NUMBER_FORMATS.years }, share('Exceedance probability per year, %', 'p'),
    money(`Aggregate (year total), ground-up, ${c}`, 'aggGu', c), money(`Aggregate (year total), after terms, ${c}`, 'aggAt', c), money(`Aggregate (year total), insured, ${c}`, 'aggIns', c),
    money(`Tail value-at-risk, insured, ${c}`, 'tvarIns', c),
    money(`Occurrence (largest event), ground-up, ${c}`, 'occGu', c), money(`Occurrence (largest event), after terms, ${c}`, 'occAt', c), money(`Occurrence (largest event), insured, ${c}`, 'occIns', c),
    money(`Aggregate, ground-up, PD, ${c}`, 'aggGuPd', c), money(`Aggregate, ground-up, BI, ${c}`, 'aggGuBi', c), money(`Aggregate, insured, PD, ${c}`, 'aggInsPd', c), money(`Aggregate, insured, BI, ${c}`, 'aggInsBi', c),
  ]
  addTableSheet(workbook, 'Exceedance', exceedanceColumns, view.portfolio.insured.aggregate.map((row, i) => byColumn(exceedanceColumns, [row.returnPeriodYears, 1 / row.returnPeriodYears,
    view.portfolio.groundUp.aggregate[i]?.loss ?? null, view.portfolio.afterTerms.aggregate[i]?.loss ?? null, row.loss, row.tailValueAtRisk,
    view.portfolio.groundUp.occurrence[i]?.loss ?? null, view.portfolio.afterTerms.occurrence[i]?.loss ?? null, view.portfolio.insured.occurrence[i]?.loss ?? null,
    view.portfolio.propertyDamage.groundUp.aggregate[i]?.loss ?? null, view.portfolio.businessInterruption.groundUp.aggregate[i]?.loss ?? null,
    view.portfolio.propertyDamage.insured.aggregate[i]?.loss ?? null, view.portfolio.businessInterruption.insured.aggregate[i]?.loss ?? null])))

  const layerColumns: SheetColumn[] = [
    label('Layer', 'name', 30), label('Kind', 'kind', 18), money(`Attachment, ${c}`, 'attachment', c), money(`Limit, ${c}`, 'limit', c), money(`Expected loss, ${c}/yr`, 'expectedLoss', perYr),
    share('Attachment probability per year, %', 'attaches'), share('Exhaustion probability per year, %', 'exhausted'),
    money(`Standard deviation of the annual loss, ${c}`, 'sd', c), money(`Loss at the tail return period, ${c}`, 'tail', c), money(`Tail value-at-risk, ${c}`, 'tvar', c),
    money(`Risk load, ${c}/yr`, 'riskLoad', perYr), money(`Expenses, ${c}/yr`, 'expenses', perYr), money(`Profit, ${c}/yr`, 'profit', perYr), money(`Technical premium, ${c}/yr`, 'premium', perYr),
  ]
  addTableSheet(workbook, 'Layers', layerColumns, view.layers.map(l => byColumn(layerColumns, [l.layer.name, l.layer.kind === 'occurrence' ? 'per occurrence' : 'annual aggregate', l.layer.attachment, l.layer.limit, l.expectedLoss, l.attachmentProbability, l.exhaustionProbability,
    l.standardDeviation, l.lossAtReturnPeriod, l.tailValueAtRisk, l.premium.riskLoad, l.premium.expenses, l.premium.profit, l.premium.premium])))

  const largestColumns: SheetColumn[] = [
    label('Site', 'site', 30), { header: 'Simulated year, number', key: 'year', unit: 'year number (1 = first simulated year)', numFmt: NUMBER_FORMATS.count },
    money(`Ground-up loss, ${c}`, 'gu', c), money(`Ground-up loss, PD, ${c}`, 'guPd', c), money(`Ground-up loss, BI, ${c}`, 'guBi', c), money(`Loss after terms, ${c}`, 'at', c), money(`Insured loss, ${c}`, 'ins', c),
    money(`Value at risk of the tanks burned, ${c}`, 'var', c), label('Tanks burned', 'tanks', 30),
  ]
  addTableSheet(workbook, 'Largest events', largestColumns, view.largestEvents.map(e => byColumn(largestColumns, [e.siteName, e.year + 1, e.groundUp, e.groundUpPd, e.groundUp - e.groundUpPd, e.afterTerms, e.insured, e.valueAtRisk,
    e.tanks.map(t => t.bySpread ? `${t.tag} (spread)` : t.tag).join(', ')])))
  return workbookBytes(workbook)
}
