// A site compiled once per task and shared by every figure computed from it: the typed-array form
// of the site (kernel.ts) and, built on first use, its thinning envelope (envelope.ts). Frequency
// mode's spread losses, year mode and the event bands all draw from the same envelope, so a task
// that needs several of them builds it once. Both are deterministic in (site, assumptions): sharing
// them changes no number.
import type { AssumptionSet } from './assumptions'
import type { Envelope } from './envelope'
import type { PreparedSite } from './kernel'
import type { SiteInput } from './types'
import { buildEnvelope } from './envelope'
import { prepareSite } from './kernel'

export interface SitePreparation {
  readonly ps: PreparedSite
  /** The site's envelope, built on the first call and returned again after. */
  envelope(): Envelope
}

export function prepareSiteOnce(site: SiteInput, assumptions: AssumptionSet): SitePreparation {
  return preparationOf(prepareSite(site, assumptions))
}

export function preparationOf(ps: PreparedSite): SitePreparation {
  let env: Envelope | undefined
  return { ps, envelope: () => (env ??= buildEnvelope(ps)) }
}
