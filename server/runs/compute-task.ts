// The worker-thread entry (piscina): one site per call.
import { computeSite, type SiteComputation, type SiteTask } from './compute'

export default function run(task: SiteTask): SiteComputation {
  return computeSite(task)
}
