// Scenario evaluations run on the runs' thread pool (server/runs/thread-pool.ts), through the
// 'scenarios' export of its task file.
import type { PairedResult } from '../../shared/capital/paired'
import { useThreadPool } from '../runs/thread-pool'
import type { ScenarioTask } from './scenario-task'

export function computeScenariosOnThread(task: ScenarioTask): Promise<PairedResult> {
  return useThreadPool().run(task, { name: 'scenarios' }) as Promise<PairedResult>
}
