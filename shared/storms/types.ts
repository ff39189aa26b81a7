// The storm report as the API answers it (GET /api/storms/windows/:id), shared by server and page.
export interface StormReportTank {
  tankId: string; siteId: string; tag: string; siteName: string; siteExternalId: string; latDeg: number; lonDeg: number
  direct: number; sparking: number; ignition: number
  drivingFlashId: string | null; drivingIgnition: number
  flashTime: string | null; flashCurrentKa: number | null; flashLat: number | null; flashLon: number | null; flashErrorKm: number | null
  fireLossPropertyDamage: number; fireLossInterruption: number
  expectedGroundUpLoss: number; expectedInsuredLoss: number; hasTerms: boolean
}

export interface StormReportView {
  window: {
    id: string; startsAt: string; endsAt: string; flashCount: number; state: string; computedAt: string | null
    engineVersion: string | null; summary: unknown; own: boolean; assumptions: string
  }
  totals: { expectedFires: number; expectedGroundUpLoss: number; expectedInsuredLoss: number; tanksWithTerms: number }
  currency: string
  tanks: StormReportTank[]
  sites: { id: string; name: string; latDeg: number; lonDeg: number }[]
  flashes: { id: string; time: string; latDeg: number; lonDeg: number; peakCurrentKa: number; type: 'ground' | 'cloud'; locationErrorKm: number | null }[]
}
