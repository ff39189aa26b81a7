// Turning a calibration into assumptions: a new assumption-set version whose changed values carry
// their provenance, or new ground flash densities on sites. One transaction each, audited.
import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { EngineInputError, parseAssumptions } from '../../shared/engine/assumptions'
import { FLASH_DENSITY_FACTOR_PATH } from '../../shared/engine/uncertainty-ranges'
import type { AssumptionCorrelation, AssumptionUncertainty, UncertainAssumption } from '../../shared/engine/uncertainty-types'
import { roundSignificant } from '../../shared/format'
import { currentLawUncertainty, flashCountUncertainty, thresholdUncertainty, type LognormalFit, type ProbitFit, type UpAndDownResult } from '../../shared/calibration'
import type { ClusterFitResult } from '../../shared/calibration/cluster-fit'
import { normalQuantile } from '../../shared/engine/normal'
import { addVersion, findVersion, mergeParameters } from '../assumptions/versions'
import { useDb } from '../db'
import { calibrationApplications, calibrations } from '../db/schema'
import type { Member } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { badRequest, conflict, notFound } from '../utils/errors'
import type { LightningSiteRow } from './lightning'
import { findSites, setSiteFlashDensity } from './sites'

type Calibration = typeof calibrations.$inferSelect

export async function findCalibration(organisationId: string, id: string): Promise<Calibration> {
  const [row] = await useDb().select().from(calibrations).where(and(eq(calibrations.id, id), eq(calibrations.organisationId, organisationId)))
  if (!row) notFound('Calibration')
  return row
}

interface FileRef { id: string, name: string, sha256: string, rows: number }

/** One parameter's provenance: the value, where it came from and how, shown beside it. */
export interface ParameterProvenance {
  source: 'calibration'
  calibrationId: string
  calibrationKind: 'lightning' | 'impulse' | 'storm_clustering'
  title: string
  method: string
  file: FileRef
  value: number | string
  unit: string
  interval: { lo: number, hi: number, confidence: number } | null
  detail: string
  appliedBy: string
  appliedAt: string
}

interface Change { key: string, value: number | string, unit: string, method: string, interval: ParameterProvenance['interval'], detail: string }

/** The uncertainty a calibration's estimates carry: entries (basis 'calibration') and their correlations. */
interface CalibratedUncertainty { entries: UncertainAssumption[], correlations: AssumptionCorrelation[] }

/** "calibration "Title" (id 1a2b3c4d, made 2026-12-03)": which calibration, and which one of that title. */
function calibrationName(c: Calibration): string {
  return `calibration "${c.title}" (id ${c.id.slice(0, 8)}, made ${new Date(c.createdAt).toISOString().slice(0, 10)})`
}

/**
 * The set's uncertainty with the calibrated entries in place of any earlier ones for the same paths
 * (and without the correlations that named those paths); the calibrated correlations added.
 */
export function withCalibratedUncertainty(current: AssumptionUncertainty, calibrated: CalibratedUncertainty): AssumptionUncertainty {
  const replaced = new Set(calibrated.entries.map(e => e.path))
  return {
    entries: [...current.entries.filter(e => !replaced.has(e.path)), ...calibrated.entries],
    correlations: [...current.correlations.filter(c => !replaced.has(c.a) && !replaced.has(c.b)), ...calibrated.correlations],
  }
}

function lightningUncertainty(c: Calibration, changes: Change[]): CalibratedUncertainty {
  const results = c.results as { pooled: { fit: LognormalFit | null }, sites: LightningSiteRow[] }
  const fit = results.pooled.fit!
  const median = changes.find(ch => ch.key === 'lognormalMedianKa')!.value as number
  const beta = changes.find(ch => ch.key === 'lognormalBeta')!.value as number
  const pair = currentLawUncertainty(fit, median, beta)
  const from = calibrationName(c)
  const entries: UncertainAssumption[] = [
    { path: 'lognormalMedianKa', distribution: pair.first, basis: 'calibration', note: `From ${from}: maximum-likelihood fit of ${fit.n} first-stroke currents; log-normal with σ of ln(median) = standard error of μ from the inverse observed Fisher information` },
    { path: 'lognormalBeta', distribution: pair.second, basis: 'calibration', note: `From ${from}: standard error of β from the inverse observed Fisher information of the same fit` },
  ]
  const count = results.sites.reduce((t, s) => t + s.flashDensity.flashCount, 0)
  const flash = flashCountUncertainty(count)
  if (flash) {
    const pct = (x: number) => `${Number(x.toPrecision(3))}`
    entries.push({
      path: FLASH_DENSITY_FACTOR_PATH, distribution: flash.distribution, basis: 'calibration',
      note: `From ${from}: ${count} flashes counted over ${results.sites.length} site${results.sites.length === 1 ? '' : 's'}; the log-normal matches the exact Poisson (Garwood 1936) 95 % interval × ${pct(flash.interval.lo)} to × ${pct(flash.interval.hi)}. Counting scatter only, common to all sites; applies where the sites' flash densities came from this calibration`,
    })
  }
  return { entries, correlations: [{ a: 'lognormalMedianKa', b: 'lognormalBeta', rho: pair.rho }] }
}

function impulseUncertainty(c: Calibration, changes: Change[], method: 'likelihood' | 'up_and_down'): CalibratedUncertainty {
  const results = c.results as { likelihood: ProbitFit | null }
  const ml = results.likelihood
  const sigmaChange = changes.find(ch => ch.key.endsWith('.sigma'))
  const u50Change = changes.find(ch => ch.key.endsWith('.u50Kv'))
  if (!ml || !sigmaChange || !u50Change) return { entries: [], correlations: [] }
  const pair = thresholdUncertainty(ml, u50Change.value as number, sigmaChange.value as number)
  const from = calibrationName(c)
  const u50Note = method === 'likelihood'
    ? `From ${from}: maximum-likelihood U50 (× the equivalence factor); log-normal with σ of ln U50 from the inverse observed Fisher information`
    : `From ${from}: up-and-down U50 (× the equivalence factor); the up-and-down mean has no standard error of its own, so σ of ln U50 is the maximum-likelihood one of the same series`
  const entries: UncertainAssumption[] = [
    { path: u50Change.key, distribution: pair.first, basis: 'calibration', note: u50Note },
    { path: sigmaChange.key, distribution: pair.second, basis: 'calibration', note: `From ${from}: maximum-likelihood σ with its standard error from the inverse observed Fisher information (normal, truncated to 0–3)` },
  ]
  return { entries, correlations: [{ a: u50Change.key, b: sigmaChange.key, rho: pair.rho }] }
}

/**
 * Storm spread and flashes per storm from their parametric-bootstrap percentile intervals: a normal
 * (truncated to the value's valid range) centred on the estimate with sd = interval width ÷ (2·z).
 * The bootstrap's correlation of the two is not kept (no correlation entry).
 */
function stormClusteringUncertainty(c: Calibration, changes: Change[]): CalibratedUncertainty {
  const from = calibrationName(c)
  const entries: UncertainAssumption[] = []
  for (const ch of changes) {
    if (!ch.interval || typeof ch.value !== 'number' || !(ch.interval.hi > ch.interval.lo)) continue
    const z = normalQuantile((1 + ch.interval.confidence) / 2)
    entries.push({
      path: ch.key, distribution: { kind: 'normal', mean: ch.value, sd: roundSignificant((ch.interval.hi - ch.interval.lo) / (2 * z), 3) }, basis: 'calibration',
      note: `From ${from}: parametric-bootstrap ${Math.round(ch.interval.confidence * 100)} % interval ${ch.interval.lo}–${ch.interval.hi} ${ch.unit} read as a normal of the same width`,
    })
  }
  return { entries, correlations: [] }
}

function setPath(target: Record<string, unknown>, key: string, value: unknown) {
  const parts = key.split('.')
  let node = target
  for (const p of parts.slice(0, -1)) node = (node[p] ??= {}) as Record<string, unknown>
  node[parts.at(-1)!] = value
}

function lightningChanges(c: Calibration): Change[] {
  const results = c.results as { pooled: { fit: LognormalFit | null, fitProblem: string | null, currents: number }, sites: LightningSiteRow[] }
  const fit = results.pooled.fit
  if (!fit) conflict(`This calibration has no current fit to apply: ${results.pooled.fitProblem ?? 'too few currents'}.`)
  const detail = `${fit.n} negative first strokes from ${results.sites.length} site${results.sites.length === 1 ? '' : 's'}, detection threshold ${fit.thresholdKa} kA`
  return [
    { key: 'currentLaw', value: 'lognormal', unit: '', method: fit.method, interval: null, detail },
    { key: 'lognormalMedianKa', value: roundSignificant(fit.medianKa, 4), unit: 'kA', method: fit.method, interval: { ...fit.medianInterval, confidence: fit.confidence }, detail },
    { key: 'lognormalBeta', value: roundSignificant(fit.beta, 4), unit: '', method: fit.method, interval: { ...fit.betaInterval, confidence: fit.confidence }, detail },
  ]
}

function stormClusteringChanges(c: Calibration): Change[] {
  const r = c.results as ClusterFitResult
  const detail = `${r.flashes} ground flashes in ${r.windows.used} windows of ${r.window.hours} h over ${Math.round(r.window.widthKm)} × ${Math.round(r.window.heightKm)} km; edge correction: ${r.edgeCorrection}`
  const interval = (i: { lo: number, hi: number, confidence: number } | undefined) => (i ? { lo: roundSignificant(i.lo, 4), hi: roundSignificant(i.hi, 4), confidence: i.confidence } : null)
  return [
    { key: 'stormClustering.spreadKm', value: roundSignificant(r.spreadKm, 4), unit: 'km', method: r.method, interval: interval(r.intervals?.spreadKm), detail },
    { key: 'stormClustering.flashesPerStorm', value: roundSignificant(r.flashesPerStorm, 4), unit: 'flashes', method: r.method, interval: interval(r.intervals?.flashesPerStorm), detail },
  ]
}

function impulseChanges(c: Calibration, method: 'likelihood' | 'up_and_down'): Change[] {
  const inputs = c.inputs as { componentClass: string, configuration: string, equivalenceFactor: number, equivalenceBasis: string }
  const results = c.results as { upAndDown: UpAndDownResult | null, upAndDownProblem: string | null, likelihood: ProbitFit | null, likelihoodProblem: string | null }
  const k = inputs.equivalenceFactor
  const factor = `test level × equivalence factor ${k} (${inputs.equivalenceBasis}); configuration: ${inputs.configuration}`
  const base = `thresholds.${inputs.componentClass}`
  const changes: Change[] = []
  if (method === 'up_and_down') {
    const ud = results.upAndDown
    if (!ud) conflict(`The up-and-down result is not valid for this series: ${results.upAndDownProblem}`)
    changes.push({ key: `${base}.u50Kv`, value: roundSignificant(ud.u50Kv * k, 4), unit: 'kV', method: ud.method, interval: null, detail: factor })
  }
  const ml = results.likelihood
  if (!ml) {
    if (method === 'likelihood') conflict(`The maximum-likelihood fit is not available for this series: ${results.likelihoodProblem}`)
    return changes
  }
  if (method === 'likelihood') {
    changes.push({ key: `${base}.u50Kv`, value: roundSignificant(ml.u50Kv * k, 4), unit: 'kV', method: ml.method, interval: { lo: ml.u50Interval.lo * k, hi: ml.u50Interval.hi * k, confidence: ml.confidence }, detail: factor })
  }
  changes.push({ key: `${base}.sigma`, value: roundSignificant(ml.sigma, 4), unit: '', method: ml.method, interval: { ...ml.sigmaInterval, confidence: ml.confidence }, detail: `${ml.applications} applications; ${factor}` })
  return changes
}

export async function applyToAssumptions(member: Member, event: H3Event, calibrationId: string, input: { assumptionVersionId: string, note: string, method: 'likelihood' | 'up_and_down' }) {
  const calibration = await findCalibration(member.organisationId, calibrationId)
  const base = await findVersion(member.organisationId, input.assumptionVersionId)
  if (!base) notFound('Assumption-set version')
  const changes = calibration.kind === 'lightning' ? lightningChanges(calibration) : calibration.kind === 'storm_clustering' ? stormClusteringChanges(calibration) : impulseChanges(calibration, input.method)
  const calibrated = calibration.kind === 'lightning'
    ? lightningUncertainty(calibration, changes)
    : calibration.kind === 'storm_clustering' ? stormClusteringUncertainty(calibration, changes) : impulseUncertainty(calibration, changes, input.method)
  const file = (calibration.results as { file: FileRef }).file
  const appliedAt = new Date().toISOString()
  const parameterChanges: Record<string, unknown> = {}
  const provenance: Record<string, ParameterProvenance> = {}
  for (const ch of changes) {
    setPath(parameterChanges, ch.key, ch.value)
    provenance[ch.key] = {
      source: 'calibration', calibrationId: calibration.id, calibrationKind: calibration.kind, title: calibration.title, method: ch.method,
      file, value: ch.value, unit: ch.unit, interval: ch.interval, detail: ch.detail, appliedBy: member.user.name, appliedAt,
    }
  }
  const note = input.note || `From calibration "${calibration.title}"`
  try {
    // The base's uncertainty as it reads now (an old version gets the illustrative ranges of its
    // default values), with the calibrated entries in place of earlier ones for the same paths.
    parameterChanges.uncertainty = withCalibratedUncertainty(parseAssumptions(base.version.parameters).uncertainty, calibrated)
    return await useDb().transaction(async (tx) => {
      const version = await addVersion(tx, base.set.id, member.user.id, {
        parameters: mergeParameters(base.version.parameters, parameterChanges),
        note,
        provenance: { ...(base.version.provenance as Record<string, unknown>), ...provenance },
      })
      const values = Object.fromEntries(changes.map(ch => [ch.key, ch.value]))
      await tx.insert(calibrationApplications).values({ organisationId: member.organisationId, calibrationId: calibration.id, target: 'assumption_version', assumptionVersionId: version.id, values, appliedBy: member.user.id })
      await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'assumption_version', entityId: version.id, before: { versionId: base.version.id, version: base.version.version }, after: { setId: base.set.id, version: version.version, note, changed: values, fromCalibration: calibration.id } }, { tx, event })
      return { version: { id: version.id, version: version.version, setId: base.set.id, setName: base.set.name }, values, provenance }
    })
  } catch (error) {
    if (error instanceof EngineInputError) badRequest(`The calibrated values do not make a valid assumption set: ${error.issues.join('; ')}`, error.fields)
    throw error
  }
}

/** Site flash densities accepted by the inventory (its CHECK: above 0, at most 100 flashes/km²/yr). */
const NG_MAX = 100

export async function applyToSites(member: Member, event: H3Event, calibrationId: string, siteIds: readonly string[]) {
  const calibration = await findCalibration(member.organisationId, calibrationId)
  if (calibration.kind !== 'lightning') badRequest('Only a lightning calibration gives site flash densities.')
  const rows = (calibration.results as { sites: LightningSiteRow[] }).sites
  const chosen = [...new Set(siteIds)].map((id) => {
    const row = rows.find(r => r.siteId === id)
    if (!row) badRequest('A chosen site was not part of this calibration.')
    if (!(row.flashDensity.ng > 0) || row.flashDensity.ng > NG_MAX) {
      badRequest(`${row.name}: a flash density of ${row.flashDensity.ng} flashes/km²/yr cannot be applied (no flashes counted, or above ${NG_MAX}). Widen the radius or keep the site's current value.`)
    }
    return row
  })
  return useDb().transaction(async (tx) => {
    const current = await findSites(member.organisationId, chosen.map(r => r.siteId), tx, true)
    if (current.length !== chosen.length) notFound('Site')
    const values: Record<string, number> = {}
    for (const row of chosen) {
      const before = current.find(s => s.id === row.siteId)!
      const ng = roundSignificant(row.flashDensity.ng, 4)
      await setSiteFlashDensity(tx, member.organisationId, row.siteId, ng)
      values[row.siteId] = ng
      await recordAudit({
        organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'site', entityId: row.siteId,
        before: { flashDensityPerKm2Yr: before.flashDensity, thunderstormDaysPerYr: before.thunderstormDays },
        after: { flashDensityPerKm2Yr: ng, thunderstormDaysPerYr: null, fromCalibration: calibration.id, interval: { lo: row.flashDensity.lo, hi: row.flashDensity.hi } },
      }, { tx, event })
    }
    await tx.insert(calibrationApplications).values({ organisationId: member.organisationId, calibrationId: calibration.id, target: 'site_flash_density', values, appliedBy: member.user.id })
    return { sites: chosen.map(r => ({ siteId: r.siteId, name: r.name, flashDensity: values[r.siteId]! })) }
  })
}
