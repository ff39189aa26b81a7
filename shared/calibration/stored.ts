// The shapes of a stored calibration as the routes return it (the `inputs` and `results` columns
// are JSON): one type for the server's writers and for the pages and components that read them.
import type { ExceedanceCurve } from './current-curves'
import type { ImpulseAnalysis } from './impulse-analysis'
import type { ImpulseApplication } from './impulse'
import type { LognormalFit } from './lognormal-fit'

export interface LightningSiteResult {
  siteId: string, name: string, externalId: string, latDeg: number, lonDeg: number, previousFlashDensity: number | null
  flashDensity: { ng: number, lo: number, hi: number, flashCount: number, areaKm2: number }
  negativeFirstStrokes: number, fittedCurrents: number, fit: LognormalFit | null, fitProblem: string | null
}

export interface LightningCalibrationResults {
  periodYears: number, periodSource: string, leftOutForLocationError: number, sites: LightningSiteResult[]
  /** The records' latitude and longitude ranges (calibrations made before it was kept have none). */
  recordsExtent?: { latitudeRange: [number, number] | null, longitudeRange: [number, number] | null }
  pooled: { currents: number, fit: LognormalFit | null, fitProblem: string | null, empirical: [number, number][], curves: ExceedanceCurve[] }
}

export interface LightningCalibrationInputs { radiusKm: number, detectionEfficiency: number, thresholdKa: number, recordsAre: string }

export interface ImpulseCalibrationInputs {
  componentClass: string, configuration: string, equivalenceFactor: number, equivalenceBasis: string
  series: ImpulseApplication[], source: { fileName: string } | null
}

type ByKind =
  | { kind: 'lightning', inputs: LightningCalibrationInputs, results: LightningCalibrationResults }
  | { kind: 'impulse', inputs: ImpulseCalibrationInputs, results: ImpulseAnalysis }

/** A row of GET /api/calibrations. */
export type CalibrationListRow = ByKind & { id: string, title: string, createdAt: string, createdBy: string | null, fileName: string }

/** GET /api/calibrations/:id. */
export type CalibrationDetail = ByKind & {
  id: string, title: string, createdAt: string, createdBy: string | null
  file: { id: string, fileName: string, byteSize: number, rowCount: number, sha256: string, createdAt: string }
  applications: { id: string, target: string, assumptionVersionId: string | null, values: Record<string, unknown>, createdAt: string, appliedBy: string | null }[]
}
