// The financial workbook of a run: Summary (cautions, provenance, pricing basis, headline figures),
// Sites, Premium, Exceedance, Layers and Largest events, property damage (PD) and business
// interruption (BI) beside every total. Every text cell that a person or the inventory supplied is written
// so that a spreadsheet cannot run it as a formula.
import ExcelJS from 'exceljs'
import { CAUTION_TEXT } from '../../shared/caution'
import { neutraliseFormula } from '../../shared/csv'
import { riskLoadLabels } from '../../shared/insurance/pricing'
import type { FinancialView } from './financial-view'
import { workbookBytes } from '../utils/downloads'

export interface WorkbookContext { currency: string, exportedBy: string, exportedAt: Date }

const text = (value: string | null | undefined) => neutraliseFormula(value ?? '')

function sheet(workbook: ExcelJS.Workbook, name: string, headers: string[]) {
  const ws = workbook.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] })
  ws.addRow(headers).font = { bold: true }
  ws.columns.forEach((c) => { c.width = 22 })
  return ws
}

export async function writeFinancialWorkbook(view: FinancialView, ctx: WorkbookContext): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook()
  workbook.creator = 'Stormledger'
  const c = ctx.currency
  const summary = workbook.addWorksheet('Summary')
  summary.columns = [{ width: 46 }, { width: 70 }]
  const rows: [string, string | number | null][] = [
    ['Stormledger — financial results of a run', null],
    ['Caution', CAUTION_TEXT.short],
    ['', CAUTION_TEXT.long],
    ['', 'Insured figures apply the policy terms below to simulated loss events; they support pricing and do not replace an underwriter\'s judgement.'],
    ['Run id', view.run.id],
    ['Portfolio', text(view.run.portfolioName)],
    ['Seed', view.run.seed],
    ['Engine version', text(view.run.engineVersion)],
    ['Assumption-set version', text(`${view.run.assumptions.setName} — version ${view.run.assumptions.version} (${view.run.assumptions.versionId})`)],
    ['Terms version', view.terms ? text(`${view.terms.setName} — version ${view.terms.version} (${view.terms.versionId})${view.terms.recordedByRun ? '' : ', not the version the run recorded'}`) : 'No terms: insured = ground-up'],
    ['Input hash (sha-256)', view.run.inputHash],
    ['Simulated years per site', view.run.years],
    ['Run started by', text(view.run.requestedBy)],
    ['Run finished', view.run.finishedAt ? new Date(view.run.finishedAt).toISOString() : null],
    ['Exported by', text(ctx.exportedBy)],
    ['Exported at', ctx.exportedAt.toISOString()],
    ['Currency', c],
    ['Risk load', riskLoadLabels[view.pricing.method]],
    ['Risk-load factor', view.pricing.factor],
    ['Tail return period (years)', view.pricing.returnPeriodYears],
    ['Expense loading (share of premium)', view.pricing.expenseRatio],
    ['Profit loading (share of premium)', view.pricing.profitRatio],
    [`Average annual loss, ground-up (${c}/yr)`, view.portfolio.groundUp.averageAnnualLoss],
    [`Average annual loss after terms (${c}/yr)`, view.portfolio.afterTerms.averageAnnualLoss],
    [`Average annual loss, insurer's share (${c}/yr)`, view.portfolio.insured.averageAnnualLoss],
    [`Insured loss at ${view.portfolio.tailReturnPeriodYears} years (${c})`, view.portfolio.insuredLossAtTail],
    [`Insured tail value-at-risk at ${view.portfolio.tailReturnPeriodYears} years (${c})`, view.portfolio.insuredTailValueAtRisk],
    [`Technical premium, total (${c}/yr)`, view.portfolio.premium.premium],
    ['Sites without terms', view.sitesWithoutTerms],
    ['Property damage / interruption split', view.hasSplit ? 'yes: PD = replacement + contents + clean-up, BI = interruption' : 'total only: the run was made before the split (engine 1); every loss is counted as property damage'],
    [`Average annual loss, ground-up, PD (${c}/yr)`, view.portfolio.propertyDamage.groundUp.averageAnnualLoss],
    [`Average annual loss, ground-up, BI (${c}/yr)`, view.portfolio.businessInterruption.groundUp.averageAnnualLoss],
    [`Average annual loss, insurer's share, PD (${c}/yr)`, view.portfolio.propertyDamage.insured.averageAnnualLoss],
    [`Average annual loss, insurer's share, BI (${c}/yr)`, view.portfolio.businessInterruption.insured.averageAnnualLoss],
    [`Technical premium, PD (${c}/yr)`, view.portfolio.premiumSplit.propertyDamage.premium],
    [`Technical premium, BI (${c}/yr)`, view.portfolio.premiumSplit.businessInterruption.premium],
  ]
  for (const r of rows) summary.addRow(r)
  summary.getRow(1).font = { bold: true, size: 14 }

  const sites = sheet(workbook, 'Sites', ['site_external_id', 'site', 'operator', 'has_terms', `occurrence_deductible_${c}`, `occurrence_limit_${c}`, `aggregate_deductible_${c}`, `aggregate_limit_${c}`, `interruption_deductible_${c}`, 'share',
    `aal_ground_up_${c}_per_yr`, `aal_after_terms_${c}_per_yr`, `aal_insured_${c}_per_yr`,
    `aal_ground_up_pd_${c}_per_yr`, `aal_ground_up_bi_${c}_per_yr`, `aal_insured_pd_${c}_per_yr`, `aal_insured_bi_${c}_per_yr`, 'share_of_years_with_loss', 'share_of_years_deductible_reached',
    `insured_loss_at_tail_${c}`, `tail_loss_contribution_${c}`, `tail_value_at_risk_contribution_${c}`, 'share_of_portfolio_tail_value_at_risk'])
  for (const s of view.sites) {
    sites.addRow([text(s.externalId), text(s.name), text(s.operatorName), s.hasTerms ? 'yes' : 'no', s.terms.occurrenceDeductible, s.terms.occurrenceLimit, s.terms.aggregateDeductible, s.terms.aggregateLimit, s.terms.interruptionDeductible, s.terms.share,
      s.averageAnnualLoss.groundUp, s.averageAnnualLoss.afterTerms, s.averageAnnualLoss.insured,
      s.averageAnnualLossSplit.propertyDamage.groundUp, s.averageAnnualLossSplit.businessInterruption.groundUp,
      s.averageAnnualLossSplit.propertyDamage.insured, s.averageAnnualLossSplit.businessInterruption.insured, s.lossYearShare, s.deductibleReachedShare,
      s.insuredLossAtReturnPeriod, s.tail.lossContribution, s.tail.tailValueAtRiskContribution, s.tail.shareOfTailValueAtRisk])
  }

  const premium = sheet(workbook, 'Premium', ['site_external_id', 'site', 'part', `expected_insured_loss_${c}`, `risk_measure_${c}`, `risk_load_${c}`, `expenses_${c}`, `profit_${c}`, `technical_premium_${c}`])
  type Lines = typeof view.portfolio.premium
  const premiumRows = (id: string, name: string, total: Lines, split: { propertyDamage: Lines, businessInterruption: Lines }) => {
    for (const [part, p] of [['total', total], ['PD', split.propertyDamage], ['BI', split.businessInterruption]] as const) {
      premium.addRow([id, name, part, p.expectedLoss, p.riskMeasure, p.riskLoad, p.expenses, p.profit, p.premium])
    }
  }
  for (const s of view.sites) premiumRows(text(s.externalId), text(s.name), s.premium, s.premiumSplit)
  premiumRows('', 'Total', view.portfolio.premium, view.portfolio.premiumSplit)
  premium.lastRow!.font = { bold: true }

  const exceedance = sheet(workbook, 'Exceedance', ['return_period_yr', 'exceedance_probability', `aggregate_ground_up_${c}`, `aggregate_after_terms_${c}`, `aggregate_insured_${c}`, `tvar_insured_${c}`, `occurrence_ground_up_${c}`, `occurrence_after_terms_${c}`, `occurrence_insured_${c}`,
    `aggregate_ground_up_pd_${c}`, `aggregate_ground_up_bi_${c}`, `aggregate_insured_pd_${c}`, `aggregate_insured_bi_${c}`])
  view.portfolio.insured.aggregate.forEach((row, i) => {
    exceedance.addRow([row.returnPeriodYears, 1 / row.returnPeriodYears,
      view.portfolio.groundUp.aggregate[i]?.loss ?? null, view.portfolio.afterTerms.aggregate[i]?.loss ?? null, row.loss, row.tailValueAtRisk,
      view.portfolio.groundUp.occurrence[i]?.loss ?? null, view.portfolio.afterTerms.occurrence[i]?.loss ?? null, view.portfolio.insured.occurrence[i]?.loss ?? null,
      view.portfolio.propertyDamage.groundUp.aggregate[i]?.loss ?? null, view.portfolio.businessInterruption.groundUp.aggregate[i]?.loss ?? null,
      view.portfolio.propertyDamage.insured.aggregate[i]?.loss ?? null, view.portfolio.businessInterruption.insured.aggregate[i]?.loss ?? null])
  })

  const layers = sheet(workbook, 'Layers', ['layer', 'kind', `attachment_${c}`, `limit_${c}`, `expected_loss_${c}_per_yr`, 'attachment_probability_per_yr', 'exhaustion_probability_per_yr',
    `standard_deviation_${c}`, `loss_at_tail_${c}`, `tail_value_at_risk_${c}`, `risk_load_${c}`, `expenses_${c}`, `profit_${c}`, `technical_premium_${c}`])
  for (const l of view.layers) {
    layers.addRow([text(l.layer.name), l.layer.kind === 'occurrence' ? 'per occurrence' : 'annual aggregate', l.layer.attachment, l.layer.limit, l.expectedLoss, l.attachmentProbability, l.exhaustionProbability,
      l.standardDeviation, l.lossAtReturnPeriod, l.tailValueAtRisk, l.premium.riskLoad, l.premium.expenses, l.premium.profit, l.premium.premium])
  }

  const largest = sheet(workbook, 'Largest events', ['site', 'simulated_year', `ground_up_${c}`, `ground_up_pd_${c}`, `ground_up_bi_${c}`, `after_terms_${c}`, `insured_${c}`, `value_at_risk_of_tanks_burned_${c}`, 'tanks_burned'])
  for (const e of view.largestEvents) {
    largest.addRow([text(e.siteName), e.year + 1, e.groundUp, e.groundUpPd, e.groundUp - e.groundUpPd, e.afterTerms, e.insured, e.valueAtRisk,
      text(e.tanks.map(t => t.bySpread ? `${t.tag} (spread)` : t.tag).join(', '))])
  }
  return workbookBytes(workbook)
}
