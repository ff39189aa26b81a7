// The storm report as the API answers it (GET /api/storms/windows/:id), shared by server and page.
import type { StormLossMethod } from './loss'

export interface StormReportTank {
  tankId: string; siteId: string; tag: string; siteName: string; siteExternalId: string; latDeg: number; lonDeg: number
  direct: number; sparking: number; ignition: number
  drivingFlashId: string | null; drivingIgnition: number
  flashTime: string | null; flashCurrentKa: number | null; flashLat: number | null; flashLon: number | null; flashErrorKm: number | null
  /** P(the tank burns): its own ignition or fire spreading to it from a tank the flashes set alight. */
  burning: number
  /** P(burns) × the expected loss of the tank given it burns (money); the tanks of a site add up to its ground-up loss. */
  expectedGroundUpLoss: number
}

/** One site the storm reached: one occurrence, its ground-up loss and the reader's insured loss. */
export interface StormReportSite {
  siteId: string; siteName: string; siteExternalId: string
  /** P(at least one tank of the site burns); null for a window computed before site losses were kept. */
  probabilityOfFire: number | null
  expectedGroundUpLoss: number
  /** Σ of every loss component's value over the site's tanks (money); null as above. */
  valueAtRisk: number | null
  /** 'current': the reader's current terms apply; 'none': the reader has no terms on the site; 'not computed': an older window. */
  terms: 'current' | 'none' | 'not computed'
  /** Expected insured loss (money, after the share) with its standard error; null unless terms are 'current'. */
  expectedInsuredLoss: number | null
  insuredSe: number | null
  method: StormLossMethod | null
  samples: number | null
  /** The most the occurrence can cost the insurer: min(value at risk, occurrence limit) × share. */
  insuredAtRisk: number | null
}

export interface StormReportView {
  window: {
    id: string; startsAt: string; endsAt: string; flashCount: number; state: string; computedAt: string | null
    engineVersion: string | null; summary: unknown; own: boolean; assumptions: string
  }
  totals: {
    expectedFires: number; expectedGroundUpLoss: number
    /** Σ over the sites under the reader's terms; sites without terms are not in it (and counted below). */
    expectedInsuredLoss: number
    /** √Σ se² of the Monte Carlo sites (0 when every site is exact). */
    insuredSe: number
    sites: number; sitesWithTerms: number; sitesWithoutTerms: number; sitesNotComputed: number
  }
  currency: string
  tanks: StormReportTank[]
  siteLosses: StormReportSite[]
  sites: { id: string; name: string; latDeg: number; lonDeg: number }[]
  flashes: { id: string; time: string; latDeg: number; lonDeg: number; peakCurrentKa: number; type: 'ground' | 'cloud'; locationErrorKm: number | null }[]
}
