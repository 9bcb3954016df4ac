/**
 * The design engine's public API: design input schema, generation,
 * factor coding, and the building blocks (fractions, CCD, Box–Behnken, D-optimal).
 */
export { designInputSchema, givenRunSchema, plannedRunCount, DESIGN_KINDS, DESIGN_LIMITS, type DesignInput, type DesignInputRaw, type DesignKind } from "./design-schema";
export { generateDesign, type DesignOutput, type DesignRun, type RunKind, type DOptimalSummary } from "./generate-design";
export {
  factorSchema,
  factorListSchema,
  codeValue,
  decodeValue,
  codePoint,
  decodePoint,
  factorLetter,
  FACTOR_LETTERS,
  FACTOR_NAME_PATTERN,
  type Factor,
  type FactorInput,
} from "./factors";
export { fullFactorialCoded, wordLength, interactionSign } from "./factorial";
export {
  parseGenerators,
  defaultGenerators,
  searchGenerators,
  definingRelation,
  resolutionOf,
  wordLengthPattern,
  aliasStructure,
  fractionalFactorialCoded,
  generatorsToText,
  wordToLetters,
  lettersToWord,
  romanResolution,
  TABLED_GENERATORS,
  type Generator,
  type SignedWord,
  type FractionalFactorial,
} from "./fractional";
export { ccdAlpha, axialPointsCoded, type AlphaChoice } from "./central-composite";
export { boxBehnkenCoded, boxBehnkenBlocks } from "./box-behnken";
export { chooseBlockWords, blockOfRow } from "./blocking";
export { seededRng, shuffle, assignRunOrder, type Rng } from "./randomize";
export {
  constraintSchema,
  parseConstraint,
  parseConstraints,
  satisfiesConstraint,
  satisfiesAll,
  constraintInCoded,
  type LinearConstraint,
  type ConstraintInput,
} from "./constraints";
export {
  fedorovExchange,
  dOptimalWorkCheck,
  gridCandidates,
  gridCandidateCount,
  candidateMatrix,
  informationMatrix,
  logDetSpd,
  inverseSpd,
  cholesky,
  D_OPTIMAL_LIMITS,
  DEFAULT_STARTS,
  DEFAULT_TABU_STEPS,
  DEFAULT_MAX_PASSES,
  type DOptimalOptions,
  type DOptimalResult,
} from "./d-optimal";
export { dOptimalPoints, isRemoved, removalReason, type PointVerdict, type DOptimalPointsOptions } from "./d-optimal-design";
export { designLogDet, dEfficiency, relativeDEfficiency, relativeDEfficiencyOfRuns, type NaturalRun } from "./d-efficiency";
export {
  safeDesignAlternatives,
  ALTERNATIVE_KINDS,
  type AlternativeKind,
  type BlockedRun,
  type DesignAlternative,
  type JudgedDesign,
  type SafeAlternatives,
  type SafeAlternativesOptions,
} from "./safe-alternatives";
export { augmentToCentralComposite, orthogonalBlockingAlpha, type AugmentOptions, type AugmentAlpha, type Augmentation, type AugmentRun } from "./augment";
export { naturalRecord, blockingAt, type SafetyCheck, type SafetyVerdict, type BlockingCaution, type FactorLimit } from "./safe-envelope";
export { formatNumber, formatFactorValue, formatNatural } from "./format";
