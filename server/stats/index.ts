// Public API of Hilum's germination and viability statistics (pure functions, no I/O).
export type { Interval } from './interval';
export { wilsonInterval } from './wilson';
export { clopperPearsonInterval } from './clopper-pearson';
export { normalRangeCdf, normalRangeQuantile } from './normal-range';
export { maxToleratedRange, computedToleratedRange, tableRow } from './tolerated-range';
export { germinationTiming, timingNote } from './germination-timing';
export type { GerminationCheck, GerminationTiming } from './germination-timing';
export { homogeneityChiSquare } from './homogeneity';
export type { TrayCount, ChiSquareResult } from './homogeneity';
export { replicateAgreement, agreementMethod, AGREEMENT_FALSE_ALARM } from './replicate-agreement';
export type { Agreement, AgreementMethod } from './replicate-agreement';
export { summarizeTest, poolChecks, FINISH_FIGURES } from './summarize-test';
export type {
  AssayTray,
  AssaySummary,
  SummarizeOptions,
  IntervalMethod,
  IntervalKind,
  TrayPercent,
  TrayState,
  FinishFigure,
} from './summarize-test';
export { probitRegression, probitRegressionGroups } from './probit-regression';
export type { DosePoint, ProbitGroup, ProbitRegressionResult, ProbitGroupsResult } from './probit-regression';
export { fitViabilityDecline, projectViability, retestAge } from './viability-decline';
export type {
  ViabilityAssay,
  ViabilityPrior,
  ViabilityOptions,
  ViabilityFit,
  ViabilityBasis,
  ViabilityProjection,
  RetestReason,
  SpeciesSlope,
} from './viability-decline';
export {
  sigmaForStorage,
  sigmaFromViabilityConstants,
  temperatureFactor,
  harringtonLifeFactor,
  harringtonStorageOk,
  UNIVERSAL_TEMPERATURE_TERMS,
} from './storage-sigma';
export type { StorageConditions, StorageSigma, ViabilityConstants } from './storage-sigma';
export {
  seedsToSow,
  binomialUpperTail,
  seedsToSowPredictive,
  betaBinomialUpperTail,
  seedsToSowBetaBinomial,
} from './seeds-to-sow';
export type { GerminationDraw } from './seeds-to-sow';
export type { Matrix } from './linear-algebra';
export {
  seedWeightFromSamples,
  purityFromSample,
  replicateWeightStats,
  SEED_WEIGHT_RULES,
  DEFAULT_SCALE_STEP_GRAMS,
  DEFAULT_PURITY_SAMPLE_SEEDS,
} from './seed-weight';
export type {
  WeighedSample,
  SeedWeight,
  SeedWeightOptions,
  SpreadBasis,
  Purity,
  PurityOptions,
} from './seed-weight';
export {
  seedsFromGrams,
  sownFromGuess,
  sownByCount,
  SOWN_GUESS_RANGES,
  SPECIES_SEEDS_PER_GRAM_CV,
} from './sown-estimate';
export type {
  SownEstimate,
  SownGuess,
  SownBy,
  SeedWeightBasis,
  SeedWeightSources,
  GramsOptions,
} from './sown-estimate';
export { germinationFromUncertainSown } from './uncertain-sown';
export type { UncertainSown, UncertainSownGermination } from './uncertain-sown';
export {
  roughScoreLikelihood,
  roughScoreCounts,
  emergenceLogLikelihood,
  ROUGH_SCORE_BANDS,
  FIELD_ESTABLISHMENT,
} from './rough-evidence';
export type { RoughScore, Emergence } from './rough-evidence';
