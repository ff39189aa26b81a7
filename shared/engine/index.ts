// Stormledger risk engine — public API. Framework-free: no import from Nuxt, Vue, Nitro or the
// database, so the same code runs in the server, in worker threads and in the browser.

/** Bumped whenever a change can alter any number the engine produces for the same input and seed. */
export const ENGINE_VERSION = '2.5.0'

export type {
  ComponentClass, TankMaterial, Contents, StructureKind, ComponentInput, TankInput, StructureInput, SiteInput,
  AttachmentModel, Estimate, CountEstimate,
} from './types'
export { COMPONENT_CLASSES, TANK_MATERIALS, CONTENTS, STRUCTURE_KINDS } from './types'

export type { AssumptionSet, AssumptionSetInput, AssumptionParameterMeta, ComponentThreshold, CurrentLawKind } from './assumptions'
export { defaultAssumptions, assumptionSetSchema, assumptionParameterMeta, parseAssumptions, EngineInputError, formatIssues } from './assumptions'
export { describeUncertainPath } from './assumptions'
export type { UncertainDistribution, UncertainAssumption, AssumptionCorrelation, AssumptionUncertainty, UncertaintyBasis } from './uncertainty-types'
export { emptyUncertainty, assumptionUncertaintySchema, uncertainDistributionSchema } from './uncertainty-types'
export type { ValueRange, UncertaintyIssue, PathDescription } from './uncertainty-ranges'
export {
  FLASH_DENSITY_FACTOR_PATH, FLASH_DENSITY_FACTOR_LABEL, VALUE_COVERAGE, assumptionValueAt, uncertainPathRange, distributionSupport,
  distributionQuantile, distributionCentre, truncatedNormalMass, uncertaintyIssues,
} from './uncertainty-ranges'
export { ILLUSTRATIVE_UNCERTAINTY, illustrativeUncertainty } from './uncertainty-defaults'
export { siteInputSchema, tankInputSchema, structureInputSchema, parseSite } from './site-schema'

export type { FlashDensityFormula } from './flash-density'
export { flashDensityFromThunderstormDays, flashesPerYearOnDisc } from './flash-density'

export type { CurrentLaw, CurrentLawSpec, TruncatedCurrentLaw } from './current'
export { powerLaw, lognormalLaw, empiricalLaw, currentLawFromSpec, truncate } from './current'

export type { StrikingDistanceParams } from './attachment'
export {
  strikingDistance, lateralAttractionDistance, isolatedCaptureRadius, indirectFlashMinimumDistance,
  collectionAreaRectangular, collectionAreaCylinder,
} from './attachment'
export { ruskVelocityFactor, ruskCoupling, couplingCoefficient, inducedPotentialKv, RUSK_Z0_OHM, SPEED_OF_LIGHT_M_PER_S } from './induction'
export { componentSparkingProbability, classSparkingProbability, combinedSparkingProbability } from './sparking'
export { ignitionGivenSpark, ignitionGivenDirect, tankSeverity, hasInducedSparking } from './ignition'
export type { LossComponent, DamageRatio, FireSpread, TankLoss, SpreadNeighbour, SpreadTable, FrequencyLosses } from './loss'
export {
  LOSS_COMPONENTS, PROPERTY_COMPONENTS, componentValues, betaShape, damageRatioQuantile, burningTankLoss, expectedBurningTankLoss,
  canBurn, shellDistanceM, spreadProbability, spreadNeighbours, spreadTable, expectedFireLoss, frequencyLosses,
} from './loss'
export { normalCdf, normalQuantile, erfc } from './normal'
export { garwoodInterval, countEstimate, normalEstimate, sumEstimates } from './statistics'
export { createStream, streamSeed } from './random'

export type { FrequencyOptions, SiteFrequencyResult, TankFrequencyResult } from './frequency'
export { simulateSiteFrequency, DEFAULT_NEGLIGIBLE_RATE_PER_YEAR } from './frequency'
export type { DirectQuadratureOptions, DirectQuadratureResult } from './direct-quadrature'
export { directStrikeQuadrature } from './direct-quadrature'
export type { YearOptions, SiteYearResult, TankYearResult, YearEventTable, YearLossSplit } from './years'
export { simulateSiteYears } from './years'
export type { YearLossSummary, YearLossTable, ReturnPeriodLoss, ExceedancePoint } from './exceedance'
export {
  summariseYearLosses, combineYearLossTables, lossAtReturnPeriod, tailValueAtRisk, exceedanceCurve, sortDescending,
  STANDARD_RETURN_PERIODS,
} from './exceedance'
export type { FrequencyRollUp, FrequencyDriver, YearRollUp } from './rollup'
export { rollUpFrequency, rollUpYears } from './rollup'
export type { QuadratureResult, QuadratureOptions } from './quadrature'
export { isolatedTankQuadrature } from './quadrature'
export type { TankHeatmap, HeatmapGrid, SiteEventBands, SiteEventBandOptions } from './heatmap'
export { tankSparkingHeatmap, siteEventBands } from './heatmap'
export type { PreparedSite } from './kernel'
export { prepareSite, evaluateFlashes } from './kernel'
export { siteRadius } from './reach'
export type { StormFlashAtSite, FlashTankProbabilities, StormQuadrature, StormTankOutcome } from './storm'
export {
  flashTankProbabilities, stormSiteOutcome, stormReachM, atLeastOnce, eastNorthOf, degreesFor, DEFAULT_STORM_QUADRATURE,
} from './storm'
export type { SiteClustering, ClusteringFrame, StormFlash } from './storm-clusters'
export {
  clusteredCandidateYears, clusteringFrame, siteClustering, projectKm, stormFlashes, stormKernel, stormIntensity, yearFactorVariance,
  sitesIndependentYears, REACH_SIGMAS, KERNEL_MASS,
} from './storm-clusters'
