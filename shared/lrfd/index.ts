/**
 * The code-method engine's public API (AASHTO LRFD Art. 4.6.2.2 approximate methods).
 * Units: internal SI in (see `../units.ts`), lane fractions out. Re-exported by `shared/index.ts`.
 */
export { DESIGN_LANE_WIDTH, designLanes, multiplePresenceFactor } from './lanes.js';
export type { Finding, FindingCode } from './findings.js';
export { formulaFamily, rigidSectionApplies, rigidSectionScope, RIGID_SECTION_TYPES, type RigidSectionScope, SD_CONSTANT_K, FAMILY_DESCRIPTIONS, type FormulaFamily } from './sectionTypes.js';
export { leverRule, leverOrdinate, type LeverRuleResult, type LeverRuleWorksheet, type LeverRuleCase, type LeverRuleTruck, type LeverRuleWheel, type LeverRuleOptions } from './leverRule.js';
export { rigidSection, type RigidSectionResult, type RigidSectionWorksheet, type RigidSectionCase } from './rigidSection.js';
export { interiorMoment, exteriorMoment } from './moment.js';
export { interiorShear, exteriorShear } from './shear.js';
export { momentSkewFactor, shearSkewFactor, type SkewFactor, type SkewInputs } from './skew.js';
export { effectLocations, type EffectLocation, type LocatedEffect } from './spanLengths.js';
export type { FormulaContext, TableOutcome, Lanes as LaneCase } from './formula.js';
export {
  computeCodeFactors,
  computeCodeFactorsFromInput,
  buildFactorRow,
  selectGoverning,
  governingFactor,
  RESULT_CAUTION,
  type CodeFactorResult,
  type FactorRow,
  type FactorRowInit,
  type FactorEffect,
  type FactorMethod,
  type FactorLocation,
  type GirderKind,
  type GoverningFactor,
  type DerivedValues,
} from './factors.js';
export { governingChoice, type Candidate, type GoverningChoice } from './choice.js';
export { canLeaveOutSkew, hasTraceParts, rowQuantity, rowSkew, withTraceParts, type RowSkew, type SkewChoice } from './quantity.js';
