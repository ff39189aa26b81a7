// The worker-thread entry (piscina): one site per call.
import { computeSite, type SiteComputation, type SiteTask } from './compute'

export default function run(task: SiteTask): SiteComputation {
  return computeSite(task)
}

/** Capital planning's scenario evaluation on the same threads (piscina `run(task, { name: 'scenarios' })`). */
export { evaluateScenarioTask as scenarios } from '../capital/scenario-task'
