import { expandPseudoComponents, gergCovers } from '#shared/physics/index.ts'
import type { FillPlanRequest } from '#shared/schemas/fill-plan.ts'
import type { ModelIdWire } from '#shared/schemas/gas.ts'
import { type PlanOptionsParsed, PlanOptionsSchema } from '#shared/schemas/plan.ts'

/** A minor component's parent gas: the pure gas, or a premix of it in the balance gas. */
export interface SourceDraft {
  gas: string
  kind: 'pure' | 'premix'
  premixAmount: string
  premixUnit: 'percent' | 'ppm'
}

/** The blender's options as typed (text stays text until it parses, so nothing typed is lost). */
export interface OptionsDraft {
  model: ModelIdWire
  method: 'partial-pressure' | 'gravimetric'
  order: 'auto' | 'as-given'
  temperatureUnit: 'C' | 'F'
  fillTemperature: string
  minimumTemperature: string
  atmosphericBar: string
  gaugeSpanBar: string
  gaugeClass: string
  gaugeResolutionBar: string
  sources: SourceDraft[]
}

export function defaultModel(gasIds: string[]): ModelIdWire {
  try {
    return gergCovers(expandPseudoComponents({ gasIds, x: gasIds.map(() => 1 / gasIds.length) }).gasIds) ? 'gerg-2008' : 'peng-robinson'
  } catch {
    return 'peng-robinson'
  }
}

export function defaultOptionsDraft(
  components: { gas: string }[],
  balanceGas: string,
  method: OptionsDraft['method'],
  temperatureUnit: 'C' | 'F',
): OptionsDraft {
  return {
    model: defaultModel(components.map((c) => c.gas)),
    method,
    order: 'auto',
    temperatureUnit,
    fillTemperature: temperatureUnit === 'F' ? '59' : '15',
    minimumTemperature: '',
    atmosphericBar: '1.01325',
    gaugeSpanBar: '',
    gaugeClass: '',
    gaugeResolutionBar: '',
    sources: components.filter((c) => c.gas !== balanceGas).map((c) => ({ gas: c.gas, kind: 'pure', premixAmount: '1', premixUnit: 'percent' })),
  }
}

/** Reopens stored options as a draft (re-plan from an earlier version). */
export function draftFromOptions(o: PlanOptionsParsed, components: { gas: string }[], balanceGas: string, lineMethod: OptionsDraft['method']): OptionsDraft {
  const tUnit = o.fillTemperature?.unit === 'F' ? 'F' : 'C'
  const toUnit = (t: { value: number; unit: string } | undefined) => {
    if (!t) return ''
    const c = t.unit === 'K' ? t.value - 273.15 : t.unit === 'F' ? ((t.value - 32) * 5) / 9 : t.value
    return String(Number((tUnit === 'F' ? (c * 9) / 5 + 32 : c).toFixed(3)))
  }
  const draft = defaultOptionsDraft(components, balanceGas, o.method ?? lineMethod, tUnit)
  draft.model = o.model
  draft.order = o.order
  draft.fillTemperature = toUnit(o.fillTemperature) || draft.fillTemperature
  draft.minimumTemperature = toUnit(o.minimumTemperature)
  if (o.atmosphericPressure?.unit === 'bar') draft.atmosphericBar = String(o.atmosphericPressure.value)
  if (o.gauge && o.gauge.span.unit === 'bar' && o.gauge.resolution.unit === 'bar') {
    draft.gaugeSpanBar = String(o.gauge.span.value)
    draft.gaugeClass = String(o.gauge.accuracyClass)
    draft.gaugeResolutionBar = String(o.gauge.resolution.value)
  }
  for (const s of o.sources ?? []) {
    if (!s.composition) continue
    const main = s.composition.filter((c) => c.gas !== balanceGas).sort((a, b) => b.fraction - a.fraction)[0]
    const target = draft.sources.find((d) => d.gas === main?.gas)
    if (main && target) {
      target.kind = 'premix'
      target.premixUnit = main.fraction < 0.001 ? 'ppm' : 'percent'
      target.premixAmount = String(target.premixUnit === 'ppm' ? main.fraction * 1e6 : main.fraction * 100)
    }
  }
  return draft
}

function num(s: string): number {
  return s.trim() === '' ? Number.NaN : Number(s.replace(',', '.'))
}

/** Parses the draft; errors are keyed by draft field. */
export function optionsFromDraft(
  d: OptionsDraft,
  balanceGas: string,
  displayPressure: 'bar' | 'psi' | 'kPa',
): { options: PlanOptionsParsed | null; errors: Record<string, string> } {
  const errors: Record<string, string> = {}
  const fill = num(d.fillTemperature)
  if (!Number.isFinite(fill)) errors.fillTemperature = 'Enter the fill temperature'
  const min = d.minimumTemperature.trim() === '' ? null : num(d.minimumTemperature)
  if (min !== null && !Number.isFinite(min)) errors.minimumTemperature = 'Enter a number or leave empty'
  const atm = num(d.atmosphericBar)
  if (!(atm > 0.5 && atm < 1.2)) errors.atmosphericBar = 'Local atmospheric pressure, between 0.5 and 1.2 bar absolute'
  const gaugeFields = [d.gaugeSpanBar, d.gaugeClass, d.gaugeResolutionBar]
  const gaugeGiven = gaugeFields.some((s) => s.trim() !== '')
  let gauge: FillPlanRequest['gauge']
  if (gaugeGiven) {
    const span = num(d.gaugeSpanBar)
    const cls = num(d.gaugeClass)
    const res = num(d.gaugeResolutionBar)
    if (!(span > 0)) errors.gaugeSpanBar = 'Full-scale span in bar'
    if (!(cls > 0 && cls <= 4)) errors.gaugeClass = 'EN 837-1 class, e.g. 0.25'
    if (!(res > 0)) errors.gaugeResolutionBar = 'Smallest readable step in bar'
    gauge = { span: { value: span, unit: 'bar' }, accuracyClass: cls, resolution: { value: res, unit: 'bar' } }
  }
  const sources: NonNullable<FillPlanRequest['sources']> = []
  d.sources.forEach((s, i) => {
    if (s.kind === 'pure') {
      sources.push({ gas: s.gas })
      return
    }
    const a = num(s.premixAmount)
    const x = s.premixUnit === 'ppm' ? a / 1e6 : a / 100
    if (!(x > 0 && x < 1)) {
      errors[`sources.${i}`] = 'Premix content above 0 and below 100 %'
      return
    }
    const label = `${s.premixUnit === 'ppm' ? `${a} ppm` : `${a} %`} ${s.gas} in ${balanceGas}`
    sources.push({
      id: label,
      composition: [
        { gas: s.gas, fraction: x },
        { gas: balanceGas, fraction: 1 - x },
      ],
    })
  })
  sources.push({ gas: balanceGas })
  if (Object.keys(errors).length) return { options: null, errors }
  const parsed = PlanOptionsSchema.safeParse({
    model: d.model,
    method: d.method,
    order: d.order,
    fillTemperature: { value: fill, unit: d.temperatureUnit },
    ...(min !== null ? { minimumTemperature: { value: min, unit: d.temperatureUnit } } : {}),
    atmosphericPressure: { value: atm, unit: 'bar', reference: 'absolute' },
    ...(gauge ? { gauge } : {}),
    sources,
    displayUnits: { pressure: displayPressure, temperature: d.temperatureUnit },
  })
  if (!parsed.success) return { options: null, errors: Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message])) }
  return { options: parsed.data, errors }
}
