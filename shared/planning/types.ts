/**
 * Types of the fill-planning engine. Everything here is SI: pressure Pa (absolute unless the name
 * says gauge), temperature K, volume m³, amount mol, mass kg, mole fractions 0..1.
 * The wire shapes (with units) live in shared/schemas/fill-plan.ts; planning/wire.ts maps between them.
 */
import type { ModelId } from '../physics/types.ts'

export type PlanMethod = 'partial-pressure' | 'gravimetric'
export type AdditionOrder = 'as-given' | 'auto'
/** Which pressure rules the cylinder is filled under: EU (ADR P200) or US (49 CFR 173.301a). */
export type CylinderRules = 'eu' | 'us'
export type Severity = 'info' | 'caution' | 'block'

/** One component of a composition. `u` is the standard uncertainty of x where known. */
export interface ComponentAmount {
  readonly gasId: string
  readonly x: number
  readonly u?: number
}

/** A parent gas: a pure gas with its purity table, or a premix with its certified composition. */
export interface SourceInput {
  /** unique label of the source within the plan, e.g. "N2" or "CO2 1 % in N2 lot 42" */
  readonly id: string
  /** main gas of a pure source; absent for a premix */
  readonly gasId?: string
  /** amount fraction of the main gas (0..1); the part not covered by `impurities` is carried as uncertainty */
  readonly purity?: number
  /** known impurities of a pure source, amount fractions */
  readonly impurities?: readonly ComponentAmount[]
  /** certified composition of a premix (all components, summing to 1) */
  readonly composition?: readonly ComponentAmount[]
}

export type ResidualInput =
  | { readonly kind: 'evacuated' }
  | {
      readonly kind: 'residual'
      /** absolute pressure of the gas left in the cylinder */
      readonly pressurePa: number
      /** temperature at which that pressure was read; default: fill temperature */
      readonly temperatureK?: number
      readonly composition: readonly ComponentAmount[]
    }

export interface CylinderInput {
  readonly waterVolumeM3: number
  /** marked service (working) pressure, absolute */
  readonly servicePressurePa: number
  /** marked test pressure, absolute; EU default 1.5 × service (gauge basis) when absent */
  readonly testPressurePa?: number
  readonly material?: string
  readonly oxygenClean: boolean
  /** next periodic test due, ISO date yyyy-mm-dd */
  readonly nextTestDate?: string
  /** US "+" marking (49 CFR 173.302a(b)): may be filled 10 % over service pressure */
  readonly plusRated?: boolean
  readonly residual: ResidualInput
}

/** Pressure gauge or transducer used for the readings. */
export interface GaugeInput {
  /** full-scale span of the gauge, Pa */
  readonly spanPa: number
  /** EN 837-1 accuracy class: limit of permissible error in % of span */
  readonly accuracyClassPercent: number
  /** smallest readable increment, Pa */
  readonly resolutionPa: number
}

export interface ScaleInput {
  /** smallest readable increment, kg */
  readonly resolutionKg: number
  /** standard uncertainty of one reading beyond resolution (calibration, drift, buoyancy), kg */
  readonly standardUncertaintyKg?: number
}

export interface FillPlanInput {
  /** target amount fractions, summing to 1 ± 1e-6, balance gas included */
  readonly target: readonly ComponentAmount[]
  /** balance (matrix) gas; default the target component with the largest fraction */
  readonly balanceGasId?: string
  /** settled pressure at the reference temperature, absolute */
  readonly finalPressurePa: number
  readonly referenceTemperatureK: number
  readonly fillTemperatureK: number
  readonly atmosphericPressurePa: number
  readonly cylinder: CylinderInput
  readonly sources: readonly SourceInput[]
  readonly method: PlanMethod
  readonly model: ModelId
  readonly order: AdditionOrder
  readonly gauge?: GaugeInput
  readonly scale?: ScaleInput
  /** allowed relative deviation of each prepared fraction from the target (e.g. 0.05 = ±5 % relative) */
  readonly blendToleranceRelative?: number
  /** largest acceptable expanded (k = 2) relative uncertainty of a component before a premix is proposed */
  readonly uncertaintyBudgetRelative?: number
  /** lowest temperature the cylinder will see in filling, storage or transport */
  readonly minimumTemperatureK?: number
  /** highest temperature the cylinder will see */
  readonly maximumTemperatureK?: number
  readonly cylinderRules?: CylinderRules
  /** date the plan is made for (ISO yyyy-mm-dd), compared with the cylinder's next test date */
  readonly asOfDate?: string
  /** standard uncertainty of each gas temperature reading, K */
  readonly temperatureUncertaintyK?: number
  /** standard uncertainty of the local atmospheric pressure, Pa */
  readonly atmosphericPressureUncertaintyPa?: number
  /** propose a multi-stage dilution when a step cannot be measured well enough (default true) */
  readonly proposePremix?: boolean
}

export interface PlanWarning {
  readonly code: string
  readonly severity: Severity
  readonly message: string
  /** plain-words caution for the people doing the work; defers to local codes and licensed practice */
  readonly caution?: string
  /** index into `steps` when the finding concerns one step */
  readonly step?: number
}

export interface ToleranceWindow {
  /** cumulative absolute pressure at fill temperature that still keeps every component within tolerance */
  readonly pressureLowPa: number
  readonly pressureHighPa: number
  /** cumulative gas mass on the scale (since the start of the fill) for the same window */
  readonly massLowKg: number
  readonly massHighKg: number
  /** the amount window behind both */
  readonly molesLow: number
  readonly molesHigh: number
}

export interface TemperatureRow {
  readonly temperatureK: number
  /** absolute pressure of the cylinder contents after the step at this temperature (constant density) */
  readonly pressurePa: number
}

export interface PlanStep {
  readonly index: number
  readonly sourceId: string
  /** what the technician connects: the gas id of a pure source, or the premix label */
  readonly label: string
  readonly sourceComposition: readonly ComponentAmount[]
  readonly molesAdded: number
  readonly massAddedKg: number
  readonly cumulativeMoles: number
  /** scale reading: gas mass added since the start of the fill (cylinder and residual tared) */
  readonly cumulativeMassKg: number
  /** cumulative absolute pressure at fill temperature after this step */
  readonly cumulativePressurePa: number
  readonly cumulativeGaugePressurePa: number
  readonly pressureRisePa: number
  readonly compressibility: number
  readonly window: ToleranceWindow
  readonly temperatureTable: readonly TemperatureRow[]
  readonly compositionAfter: readonly ComponentAmount[]
}

export interface PredictedComponent {
  readonly gasId: string
  readonly x: number
  /** standard uncertainty (k = 1) */
  readonly u: number
  /** expanded uncertainty, coverage factor 2 */
  readonly expandedU: number
  /** target fraction (0 for impurities not in the target) */
  readonly target: number
  /** (x − target)/target, null where the target is 0 */
  readonly deviationRelative: number | null
}

export interface UncertaintyContribution {
  readonly input: string
  readonly gasId: string
  /** contribution |c|·u to the standard uncertainty of x(gasId) */
  readonly contribution: number
}

export interface PressureCheck {
  readonly label: string
  readonly temperatureK: number
  readonly pressurePa: number
  readonly limitPa: number | null
  readonly rule: string
  readonly pass: boolean
}

export interface Classification {
  readonly flammable: boolean | null
  /** ISO 10156 Σ A'ᵢ/Tciᵢ (null when the method does not apply) */
  readonly flammabilityIndex: number | null
  readonly oxidisingPower: number | null
  readonly oxidising: boolean
  /** LC50 of the mixture by additivity, ppm V; null when no toxic component */
  readonly lc50MixPpm: number | null
  readonly toxic: boolean
  /** transport division with the precedence 2.3 > 2.1 > 2.2 */
  readonly division: '2.1' | '2.2' | '2.3'
  readonly subsidiary: readonly string[]
  readonly notes: readonly string[]
}

export interface InitialState {
  readonly moles: number
  readonly pressurePa: number
  readonly composition: readonly ComponentAmount[]
}

export interface SolutionInfo {
  readonly method: 'direct' | 'nnls'
  /** largest |x_pred − x_target|/x_target over target components */
  readonly maxRelativeDeviation: number
  readonly note: string
}

export interface PremixStage {
  readonly label: string
  /** the component this premix dilutes */
  readonly gasId: string
  readonly reason: string
  readonly plan: FillPlan
}

export interface PremixProposal {
  readonly reason: string
  /** premix cylinders in the order they are made (each stage feeds the next) */
  readonly stages: readonly PremixStage[]
  /** the product plan that uses the premixes as sources */
  readonly productPlan: FillPlan
}

export interface FillPlan {
  readonly method: PlanMethod
  readonly model: ModelId
  readonly modelNotes: readonly string[]
  readonly finalPressurePa: number
  readonly referenceTemperatureK: number
  readonly fillTemperatureK: number
  readonly atmosphericPressurePa: number
  readonly waterVolumeM3: number
  readonly totalMoles: number
  readonly totalMassKg: number
  readonly initial: InitialState
  readonly steps: readonly PlanStep[]
  readonly predictedComposition: readonly PredictedComponent[]
  readonly uncertaintyMethod: string
  readonly uncertaintyBudget: readonly UncertaintyContribution[]
  readonly solution: SolutionInfo
  readonly orderRules: readonly string[]
  readonly pressureChecks: readonly PressureCheck[]
  readonly classification: Classification
  /** lowest temperature at which the finished cylinder passes the condensation screen (null: no condensable) */
  readonly minimumSafeTemperatureK: number | null
  readonly warnings: readonly PlanWarning[]
  /** false when any warning blocks approval */
  readonly approvable: boolean
  readonly assumptions: readonly string[]
  readonly premixProposal?: PremixProposal
}
