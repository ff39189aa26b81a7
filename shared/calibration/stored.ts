// The shapes of a stored calibration as the routes return it (the `inputs` and `results` columns
// are JSON): one type for the server's writers and for the pages and components that read them.
import type { ClusterFitResult, LatLonBox } from './cluster-fit'
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

export interface StormClusteringCalibrationInputs {
  box: LatLonBox | null, windowHours: number, detectionEfficiency: number, recordsAre: string, periodYears: number | null
  maxLocationErrorKm: number | null, bootstrap: number
}

export type StormClusteringCalibrationResults = ClusterFitResult & {
  periodYears: number, periodSource: string, boxSource: string, groundRecords: number, leftOutForLocationError: number
}

type ByKind =
  | { kind: 'lightning', inputs: LightningCalibrationInputs, results: LightningCalibrationResults }
  | { kind: 'impulse', inputs: ImpulseCalibrationInputs, results: ImpulseAnalysis }
  | { kind: 'storm_clustering', inputs: StormClusteringCalibrationInputs, results: StormClusteringCalibrationResults }

/** A row of GET /api/calibrations. */
export type CalibrationListRow = ByKind & { id: string, title: string, createdAt: string, createdBy: string | null, fileName: string }

/** GET /api/calibrations/:id. */
export type CalibrationDetail = ByKind & {
  id: string, title: string, createdAt: string, createdBy: string | null
  file: { id: string, fileName: string, byteSize: number, rowCount: number, sha256: string, createdAt: string }
  applications: { id: string, target: string, assumptionVersionId: string | null, values: Record<string, unknown>, createdAt: string, appliedBy: string | null }[]
}

/** A row of GET /api/calibrations/lightning-files: a stored records file and what it holds. */
export interface RecordsFileRow {
  id: string, fileName: string, rowCount: number, createdAt: string, uploadedBy: string | null
  summary: { groundRecords: number, cloudRecords: number, negativeGround: number, firstTime: string, lastTime: string, spanYears: number, latitudeRange: [number, number] | null, longitudeRange: [number, number] | null }
}
