// One site's scenario evaluation, as run on a worker thread: baseline and every scenario on the
// same draws (shared/capital/paired.ts). Pure.
import type { AssumptionSet } from '../../shared/engine/assumptions'
import type { SiteInput } from '../../shared/engine/types'
import { parseSite } from '../../shared/engine/site-schema'
import { applyActions, type ActionEffect } from '../../shared/capital/actions'
import { evaluateScenariosPaired, type PairedResult } from '../../shared/capital/paired'

export interface ScenarioSpec { key: string, actionIds: string[], actions: ActionEffect[] }

export interface ScenarioTask {
  site: SiteInput
  scenarios: ScenarioSpec[]
  assumptions: AssumptionSet
  seed: number
  samplesPerTank: number
}

export function evaluateScenarioTask(task: ScenarioTask): PairedResult {
  const base = parseSite(task.site)
  const scenarios = task.scenarios.map(s => ({ key: s.key, site: parseSite(applyActions(base, s.actions)) }))
  return evaluateScenariosPaired(base, scenarios, task.assumptions, { seed: task.seed, samplesPerTank: task.samplesPerTank })
}
