// The plan workbook: the caution, the plan's totals, its actions with their paired figures, and
// each site's actions measured together. Text from people is neutralised against formula injection.
import { CAUTION_FULL } from '../../shared/caution'
import { MITIGATION_LABELS, NO_EFFECT_REASON, hasModelEffect } from '../../shared/capital/actions'
import type { planDetail } from './plan-detail'
import { addCautionSheet, addTableSheet, decimalsFor, newWorkbook, NUMBER_FORMATS, valueRow, type SheetColumn } from '../utils/sheets'
import { workbookBytes } from '../utils/downloads'

type Detail = NonNullable<Awaited<ReturnType<typeof planDetail>>>

export async function writePlanWorkbook(detail: Detail, currency: string): Promise<Buffer> {
  const wb = newWorkbook()
  const c = currency
  const p = detail.plan
  const MONEY = NUMBER_FORMATS.money
  const firesFmt = decimalsFor(detail.actions.flatMap(a => a.figures ? [a.figures.ignition.reduction.rate, a.figures.ignition.reduction.se] : []))
  const reductionUnit = p.metric === 'loss' ? `${c}/yr` : 'fires/yr'
  // The plan sheet opens with the caution (B1), then the plan's figures.
  addCautionSheet(wb, {
    name: 'Plan', widths: [42, 60],
    rows: [
      valueRow('Plan', p.name),
      valueRow(`Budget, ${c}`, p.budget, MONEY),
      valueRow(`Total cost, ${c}`, p.totalCost, MONEY),
      valueRow('Optimised for', p.metric === 'loss' ? `average annual loss (AAL) reduction, ${c}/yr` : 'expected fires reduction, fires/yr'),
      valueRow(`Sum of the actions' reductions, ${reductionUnit}`, p.reduction, p.metric === 'loss' ? MONEY : firesFmt),
      valueRow('Actions, count', detail.actions.length),
      valueRow('How reductions were measured', 'Baseline and each action on the same random draws; intervals are 95 % from the paired differences.'),
    ],
  })

  const fires = (header: string, key: string): SheetColumn => ({ header, key, unit: 'fires per year', numFmt: firesFmt })
  const loss = (header: string, key: string): SheetColumn => ({ header, key, unit: `${c} per year`, numFmt: MONEY })
  addTableSheet(wb, 'Actions', [
    { header: 'Site', key: 'site', unit: '', width: 28 }, { header: 'Tank', key: 'tank', unit: '', width: 12 }, { header: 'Option', key: 'option', unit: '', width: 36 },
    { header: 'Kind', key: 'kind', unit: '', width: 30 }, { header: `Cost, ${c}`, key: 'cost', unit: c, numFmt: MONEY },
    fires('Expected fires reduction, /yr', 'fires'), fires('Expected fires reduction, 95 % low, /yr', 'firesLo'), fires('Expected fires reduction, 95 % high, /yr', 'firesHi'),
    fires('Expected fires reduction, standard error (same random draws), /yr', 'firesSe'), fires('Expected fires reduction, standard error (independent estimates), /yr', 'firesSeInd'),
    loss(`AAL reduction, ${c}/yr`, 'loss'), loss(`AAL reduction, 95 % low, ${c}/yr`, 'lossLo'), loss(`AAL reduction, 95 % high, ${c}/yr`, 'lossHi'),
    { header: 'Note', key: 'note', unit: '', width: 60 },
  ], detail.actions.map((a) => {
    const f = a.figures
    return {
      site: a.siteName, tank: a.tankTag, option: a.optionName, kind: MITIGATION_LABELS[a.kind], cost: a.cost,
      fires: f?.ignition.reduction.rate ?? null, firesLo: f?.ignition.reduction.lo ?? null, firesHi: f?.ignition.reduction.hi ?? null,
      firesSe: f?.ignition.reduction.se ?? null, firesSeInd: f?.ignition.independentSe ?? null,
      loss: f?.loss.reduction.rate ?? null, lossLo: f?.loss.reduction.lo ?? null, lossHi: f?.loss.reduction.hi ?? null,
      note: hasModelEffect(a.kind) ? a.note : NO_EFFECT_REASON,
    }
  }))
  addTableSheet(wb, 'Sites together', [
    { header: 'Site', key: 'site', unit: '', width: 28 }, { header: 'Actions, count', key: 'n', unit: 'count', numFmt: NUMBER_FORMATS.count },
    fires('Expected fires reduction, /yr', 'fires'), fires('Expected fires reduction, standard error, /yr', 'firesSe'),
    loss(`AAL reduction, ${c}/yr`, 'loss'), loss(`AAL reduction, standard error, ${c}/yr`, 'lossSe'),
  ], detail.sites.map(s => ({ site: s.siteName, n: s.actionIds.length, fires: s.together?.ignition.reduction.rate ?? 'not measured together yet', firesSe: s.together?.ignition.reduction.se ?? null, loss: s.together?.loss.reduction.rate ?? null, lossSe: s.together?.loss.reduction.se ?? null })))
  const caution = wb.addWorksheet('Caution')
  caution.getColumn(1).width = 120
  caution.getCell(1, 1).value = CAUTION_FULL
  return workbookBytes(wb)
}
