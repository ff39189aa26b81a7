// Illustrative uncertainty ranges for the illustrative default assumptions (issue "How sure are we").
// Each range is centred on its default value (the median, mean or mode equals it), has basis
// 'illustrative' and says why the range is as wide as it is. They are used only by runs with
// assumption draws; a calibration replaces the ranges of the values it estimates. An illustrative
// range belongs to its default value: when a set's value differs from the default, the range is
// dropped (parseAssumptions), because a range around someone else's number says nothing about it.
import type { AssumptionUncertainty, UncertainAssumption } from './uncertainty-types'

const RANGE_LABEL = 'illustrative range — calibrate'

const THRESHOLD_CLASSES = [['sharp_device', 70], ['grounded_pipe', 100], ['rounded_conductor', 140], ['carbon_fibre', 90]] as const

const u50Note = `${RANGE_LABEL}. From memory: impulse sparking levels of nominally similar fittings differ by up to about a factor of 2 with shape, spacing and contact condition, so ×/÷ 2 covers 95 % (σ of ln U50 = ln 2 / 1.96 ≈ 0.35); an impulse-test calibration replaces it`
const sigmaNote = `${RANGE_LABEL}. From memory: repeated impulse tests of one gap show a log-normal scatter of a few per cent for clean electrodes and tens of per cent for loose or contaminated contacts; 0.1 to 0.6 around the default 0.3`

function thresholds(): UncertainAssumption[] {
  return THRESHOLD_CLASSES.flatMap(([cls, u50]) => [
    { path: `thresholds.${cls}.u50Kv`, distribution: { kind: 'lognormal', median: u50, sigmaLn: 0.35 }, basis: 'illustrative', note: u50Note },
    { path: `thresholds.${cls}.sigma`, distribution: { kind: 'triangular', min: 0.1, mode: 0.3, max: 0.6 }, basis: 'illustrative', note: sigmaNote },
  ] satisfies UncertainAssumption[])
}

const ignitionNote = `${RANGE_LABEL}. From memory: whether a spark ignites depends on the vapour at the spark lying inside its flammable range, which changes with temperature, filling and venting; roughly ×/÷ 2 around the default, kept inside [0, 1]`

const damageNote = `${RANGE_LABEL}. From memory: tank fire losses run from a rim-seal fire put out early to the loss of tank and contents; the mean share is known to perhaps ±0.3, kept where the beta distribution with the set's standard deviation exists`

const illustrative = (path: string, distribution: UncertainAssumption['distribution'], note: string): UncertainAssumption => ({ path, distribution, basis: 'illustrative', note })

export const ILLUSTRATIVE_UNCERTAINTY: Readonly<AssumptionUncertainty> = Object.freeze({
  entries: [
    illustrative('powerLawMedianKa', { kind: 'lognormal', median: 31, sigmaLn: 0.2 }, `${RANGE_LABEL}. From memory: median first-stroke peak currents reported by tower measurements and location networks range about 20–45 kA (95 % range ×/÷ 1.5); a lightning calibration replaces the current law`),
    illustrative('powerLawExponent', { kind: 'normal', mean: 2.6, sd: 0.2 }, `${RANGE_LABEL}. From memory: published power-law fits of peak currents use exponents of about 2.2–3.0 (IEEE Std 1410 gives 2.6)`),
    illustrative('lognormalMedianKa', { kind: 'lognormal', median: 31.1, sigmaLn: 0.2 }, `${RANGE_LABEL}. From memory: median first-stroke peak currents reported by tower measurements and location networks range about 20–45 kA (95 % range ×/÷ 1.5); a lightning calibration replaces it`),
    illustrative('lognormalBeta', { kind: 'normal', mean: 0.484, sd: 0.07 }, `${RANGE_LABEL}. From memory: log standard deviations of first-stroke currents in published fits lie about 0.35–0.62 (CIGRE 0.484); a lightning calibration replaces it`),
    illustrative('returnStrokeVelocity', { kind: 'triangular', min: 0.8e8, mode: 1.2e8, max: 2.0e8 }, `${RANGE_LABEL}. The coupling Kc follows from it (Rusk 1958). From memory: optical measurements put return-stroke velocities mostly between one third and two thirds of the speed of light`),
    ...thresholds(),
    illustrative('ignitionGivenSpark.crude', { kind: 'triangular', min: 0.1, mode: 0.3, max: 0.6 }, ignitionNote),
    illustrative('ignitionGivenSpark.condensate', { kind: 'triangular', min: 0.15, mode: 0.4, max: 0.7 }, ignitionNote),
    illustrative('ignitionGivenSpark.produced_water', { kind: 'triangular', min: 0.02, mode: 0.1, max: 0.25 }, ignitionNote),
    illustrative('ignitionGivenDirectNonConducting', { kind: 'triangular', min: 0.2, mode: 0.5, max: 0.9 }, `${RANGE_LABEL}. From memory: a direct strike to a non-conducting tank with vapour space very often ignites it; the share is uncertain between about one in five and nine in ten`),
    illustrative('ignitionGivenDirectSteel', { kind: 'triangular', min: 0.005, mode: 0.02, max: 0.06 }, `${RANGE_LABEL}. From memory: steel shells of at least about 5 mm are not punctured by most strikes (IEC 62305-3 treats 5 mm steel as puncture-proof); ignition then comes from vents and seals, ×/÷ 3 around the default`),
    illustrative('vapourControlFactor', { kind: 'triangular', min: 0.1, mode: 0.3, max: 0.6 }, `${RANGE_LABEL}. From memory: sealed floating roofs and vapour recovery remove most but not all of the flammable vapour at vents; ×/÷ 2 around the default`),
    illustrative('damageRatio.replacement.mean', { kind: 'triangular', min: 0.4, mode: 0.7, max: 0.92 }, damageNote),
    illustrative('damageRatio.contents.mean', { kind: 'triangular', min: 0.5, mode: 0.8, max: 0.92 }, damageNote),
    illustrative('damageRatio.cleanup.mean', { kind: 'triangular', min: 0.3, mode: 0.6, max: 0.88 }, damageNote),
    illustrative('damageRatio.interruption.mean', { kind: 'triangular', min: 0.3, mode: 0.6, max: 0.88 }, damageNote),
    illustrative('fireSpread.probabilityAtContact', { kind: 'triangular', min: 0.05, mode: 0.25, max: 0.5 }, `${RANGE_LABEL}. From memory: fire reaching a touching neighbour is neither rare nor the rule in tank-farm fire histories; 0.05–0.5`),
    illustrative('fireSpread.decayLengthM', { kind: 'lognormal', median: 5, sigmaLn: 0.5 }, `${RANGE_LABEL}. From memory: spacing practice (NFPA 30) expects neighbours one spacing away to be exposed but rarely lost; a decay length of about 2–13 m (×/÷ 2.7 at 95 %)`),
    illustrative('flashDensityFactor', { kind: 'lognormal', median: 1, sigmaLn: 0.35 }, `${RANGE_LABEL}. Multiplies every site's ground flash density. From memory: flash density estimated from thunderstorm days (Anderson's formula) is commonly quoted as good to about a factor of 2 (×/÷ 2 at 95 %); a lightning calibration replaces it with the counting uncertainty`),
  ] satisfies UncertainAssumption[],
  correlations: [],
})

/** A fresh copy of the illustrative uncertainty (the defaults object is frozen). */
export function illustrativeUncertainty(): AssumptionUncertainty {
  return structuredClone({ entries: [...ILLUSTRATIVE_UNCERTAINTY.entries], correlations: [...ILLUSTRATIVE_UNCERTAINTY.correlations] })
}
