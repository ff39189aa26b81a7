// The plan workbook: the caution, the plan's totals, its actions with their paired figures, and
// each site's actions measured together. Text from people is neutralised against formula injection.
import ExcelJS from 'exceljs'
import { CAUTION_FULL } from '../../shared/caution'
import { neutraliseFormula } from '../../shared/csv'
import { MITIGATION_LABELS, NO_EFFECT_REASON, hasModelEffect } from '../../shared/capital/actions'
import type { planDetail } from './plan-detail'
import { workbookBytes } from '../utils/downloads'

type Detail = NonNullable<Awaited<ReturnType<typeof planDetail>>>

const text = (v: string | null | undefined) => (v ? neutraliseFormula(v) : '')

export async function writePlanWorkbook(detail: Detail, currency: string): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Stormledger'
  const summary = wb.addWorksheet('Plan')
  summary.getColumn(1).width = 42
  summary.getColumn(2).width = 60
  const p = detail.plan
  const rows: Array<[string, string | number]> = [
    ['Caution', CAUTION_FULL],
    ['Plan', text(p.name)],
    [`Budget (${currency})`, p.budget],
    [`Total cost (${currency})`, p.totalCost],
    ['Optimised for', p.metric === 'loss' ? `average annual loss reduction (${currency}/yr)` : 'expected fires per year reduction (/yr)'],
    ['Sum of the actions\' reductions', p.reduction],
    ['Actions', detail.actions.length],
    ['How reductions were measured', 'Baseline and each action on the same random draws (common random numbers); intervals are 95 % from the paired differences.'],
  ]
  rows.forEach(([k, v], i) => { summary.getCell(i + 1, 1).value = k; summary.getCell(i + 1, 2).value = v })
  summary.getCell(1, 2).alignment = { wrapText: true }

  const actions = wb.addWorksheet('Actions')
  actions.columns = [
    { header: 'site', key: 'site', width: 28 }, { header: 'tank', key: 'tank', width: 12 }, { header: 'option', key: 'option', width: 36 },
    { header: 'kind', key: 'kind', width: 30 }, { header: `cost_${currency}`, key: 'cost', width: 14 },
    { header: 'fires_reduction_per_yr', key: 'fires', width: 20 }, { header: 'fires_reduction_lo', key: 'firesLo', width: 18 }, { header: 'fires_reduction_hi', key: 'firesHi', width: 18 },
    { header: 'fires_reduction_se_paired', key: 'firesSe', width: 22 }, { header: 'fires_reduction_se_independent', key: 'firesSeInd', width: 26 },
    { header: `loss_reduction_${currency}_per_yr`, key: 'loss', width: 22 }, { header: 'loss_reduction_lo', key: 'lossLo', width: 18 }, { header: 'loss_reduction_hi', key: 'lossHi', width: 18 },
    { header: 'note', key: 'note', width: 60 },
  ]
  for (const a of detail.actions) {
    const f = a.figures
    actions.addRow({
      site: text(a.siteName), tank: text(a.tankTag), option: text(a.optionName), kind: MITIGATION_LABELS[a.kind], cost: a.cost,
      fires: f?.ignition.reduction.rate ?? null, firesLo: f?.ignition.reduction.lo ?? null, firesHi: f?.ignition.reduction.hi ?? null,
      firesSe: f?.ignition.reduction.se ?? null, firesSeInd: f?.ignition.independentSe ?? null,
      loss: f?.loss.reduction.rate ?? null, lossLo: f?.loss.reduction.lo ?? null, lossHi: f?.loss.reduction.hi ?? null,
      note: hasModelEffect(a.kind) ? text(a.note) : NO_EFFECT_REASON,
    })
  }
  const sites = wb.addWorksheet('Sites together')
  sites.columns = [
    { header: 'site', key: 'site', width: 28 }, { header: 'actions', key: 'n', width: 10 },
    { header: 'fires_reduction_per_yr', key: 'fires', width: 20 }, { header: 'fires_reduction_se', key: 'firesSe', width: 18 },
    { header: `loss_reduction_${currency}_per_yr`, key: 'loss', width: 22 }, { header: 'loss_reduction_se', key: 'lossSe', width: 18 },
  ]
  for (const s of detail.sites) {
    sites.addRow({ site: text(s.siteName), n: s.actionIds.length, fires: s.together?.ignition.reduction.rate ?? 'not measured together yet', firesSe: s.together?.ignition.reduction.se ?? null, loss: s.together?.loss.reduction.rate ?? null, lossSe: s.together?.loss.reduction.se ?? null })
  }
  const caution = wb.addWorksheet('Caution')
  caution.getColumn(1).width = 120
  caution.getCell(1, 1).value = CAUTION_FULL
  return workbookBytes(wb)
}
