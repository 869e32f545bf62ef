/**
 * The physics core's public surface: code outside shared/physics imports from here, except that gases.ts (the gas
 * library) and constants.ts, which load no equation of state, may be imported directly by modules that must stay
 * light, such as the order schemas and order formatting of the home page (an import from here brings the equations
 * of state and the GERG-2008 parameter table into the importer's chunk).
 * Pure TypeScript, no I/O; runs in the browser and on the server. SI units throughout (K, Pa absolute, mol/m³,
 * m³, kg); conversions to display units live in units.ts and happen at the edges.
 */

export {
  MODEL_IDS,
  type Mixture,
  type ModelId,
  PhysicsInputError,
  type PhysicsWarning,
  type StateResult,
} from './types.ts'

export {
  GAS_CONSTANT_J_PER_MOL_K,
  ISO_10156_FLAMMABILITY_LIMIT,
  ISO_10156_OXIDISING_POWER_LIMIT,
  KG_PER_POUND,
  M3_PER_CUBIC_FOOT,
  PA_PER_BAR,
  PA_PER_PSI,
  STANDARD_ATMOSPHERE_PA,
  TOXIC_LC50_LIMIT_PPMV,
  ZERO_CELSIUS_K,
} from './constants.ts'

export {
  type DataStatus,
  type FlammabilityLimits,
  GAS_IDS,
  GASES,
  type Gas,
  type GasSourceKey,
  getGas,
  type HazardFlag,
  type Iso10156Coefficients,
  isKnownGas,
  type ReactivityGroup,
  type Toxicity,
  type VapourPressureCorrelation,
} from './gases.ts'

export { evaluateVapourPressureCorrelation, vapourPressureEstimatePa, vapourPressurePa } from './vapour-pressure.ts'

export {
  findIncompatibilities,
  INCOMPATIBLE_PAIRS,
  type IncompatibilityFinding,
  type IncompatibilitySeverity,
  type IncompatiblePair,
} from './incompatibility.ts'

export {
  expandPseudoComponents,
  MIXTURE_SUM_TOLERANCE,
  mixtureMolarMassKgPerMol,
  pureGas,
  validateMixture,
} from './mixture.ts'

export {
  type CubicModelId,
  interactionParameter,
  KIJ_TABLES,
  type KijEntry,
  type KijTable,
  PENG_ROBINSON_KIJ,
  SRK_KIJ,
  VAN_DER_WAALS_KIJ,
} from './eos/kij.ts'

export {
  type CubicComponent,
  type CubicDensitySolution,
  type CubicFamily,
  cubicSaturationPressurePa,
  type PreparedCubic,
  prepareCubic,
  prepareCubicFromConstants,
} from './eos/cubic-core.ts'
export { idealGasDensityMolPerM3, idealGasMolarVolumeM3PerMol, idealGasPressurePa } from './eos/ideal-gas.ts'
export { VAN_DER_WAALS } from './eos/van-der-waals.ts'
export { SOAVE_REDLICH_KWONG } from './eos/soave-redlich-kwong.ts'
export { PENG_ROBINSON } from './eos/peng-robinson.ts'
export { realCubicRoots, solveMonicCubicInto } from './numeric/cubic-roots.ts'

export {
  GERG_COMPONENT_IDS,
  GERG_EXTENDED_RANGE,
  GERG_GAS_CONSTANT,
  GERG_NORMAL_RANGE,
  type GergDensityResult,
  type GergMixture,
  type GergPressureResult,
  type GergProperties,
  gergCovers,
  gergDensity,
  gergPressure,
  gergProperties,
  gergValidity,
  prepareGergMixture,
} from './eos/gerg-2008/index.ts'

export {
  CUBIC_CHECKED_RANGE,
  checkPressurePa,
  checkTemperatureK,
  condensationWarnings,
  evaluateState,
  type PreparedModel,
  type PrepareModelOptions,
  prepareCubicModel,
  prepareModel,
  pressureFromTRho,
  REAL_GAS_CAVEAT_THRESHOLD,
  stateFromTP,
} from './state.ts'

export {
  amountFromStandardVolume,
  type CylinderContents,
  cylinderContents,
  type GasPropertiesAtState,
  gasPropertiesAtState,
  getReferenceCondition,
  idealMassDensityKgPerM3,
  massDensityKgPerM3,
  molarVolumeM3PerMol,
  type PartialPressures,
  type PartialVolumes,
  partialPressures,
  partialVolumes,
  REFERENCE_CONDITIONS,
  type ReferenceCondition,
  type ReferenceConditionId,
  type StandardVolume,
  standardVolume,
} from './quantities.ts'

export {
  type AmountFractionUnit,
  type Concentrations,
  concentrations,
  fractionFromMassConcentrationMgPerM3,
  fractionToPercent,
  fractionToPpb,
  fractionToPpm,
  fromAmountFraction,
  massConcentrationMgPerM3FromFraction,
  massFractionsFromMoleFractions,
  moleFractionsFromMassFractions,
  moleFractionsFromVolumeFractions,
  percentToFraction,
  ppbToFraction,
  ppmToFraction,
  type PureCompressibilities,
  pureCompressibilities,
  toAmountFraction,
  type VolumeFractions,
  volumeConcentrations,
  volumeFractions,
  volumeFractionsFromMoleFractions,
} from './composition.ts'

export {
  fromCubicMetres,
  fromKelvin,
  fromKilograms,
  fromPa,
  MASS_UNITS,
  type MassQuantity,
  type MassUnit,
  PRESSURE_UNITS,
  type PressureQuantity,
  type PressureReference,
  type PressureUnit,
  TEMPERATURE_UNITS,
  type TemperatureQuantity,
  type TemperatureUnit,
  toCubicMetres,
  toKelvin,
  toKilograms,
  toPa,
  VOLUME_UNITS,
  type VolumeQuantity,
  type VolumeUnit,
} from './units.ts'

export {
  type FlammabilityResult,
  type FlammabilityTerm,
  iso10156Flammability,
  iso10156OxidisingPower,
  leChatelierLflPercent,
  mixtureLc50,
  type OxidisingPowerResult,
  type ToxicityResult,
} from './flammability.ts'
