import { MODEL_ID_VALUES, MODEL_LABEL, type ModelIdWire } from '#shared/schemas/gas.ts'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { cn } from '#src/lib/cn.ts'
import { inputClass } from '#src/components/ui/field.tsx'
import { formulaOf } from '../lib/format-plan.ts'
import type { OptionsDraft } from '../lib/options-draft.ts'

/** How the blender wants the plan made: model, method, temperatures, gauge, order of addition, parent gases. */
export function PlanOptionsForm({
  draft,
  onChange,
  errors,
  balanceGas,
}: {
  draft: OptionsDraft
  onChange: (d: OptionsDraft) => void
  errors: Record<string, string>
  balanceGas: string
}) {
  const set = (patch: Partial<OptionsDraft>) => onChange({ ...draft, ...patch })
  const t = draft.temperatureUnit === 'F' ? '°F' : '°C'
  return (
    <div className="space-y-3">
      <div className="grid grid-cols-2 gap-2">
        <Field label="Equation of state">
          {(id) => (
            <Select id={id} value={draft.model} onChange={(e) => set({ model: e.target.value as ModelIdWire })}>
              {MODEL_ID_VALUES.map((m) => (
                <option key={m} value={m}>
                  {MODEL_LABEL[m]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Method">
          {(id) => (
            <Select id={id} value={draft.method} onChange={(e) => set({ method: e.target.value as OptionsDraft['method'] })}>
              <option value="partial-pressure">Partial pressure</option>
              <option value="gravimetric">Gravimetric</option>
            </Select>
          )}
        </Field>
      </div>
      <Field label="Order of addition">
        {(id) => (
          <Select id={id} value={draft.order} onChange={(e) => set({ order: e.target.value as OptionsDraft['order'] })}>
            <option value="auto">By the safety rules (smallest and most condensable first, balance last)</option>
            <option value="as-given">As listed in the sources</option>
          </Select>
        )}
      </Field>
      <div className="grid grid-cols-[1fr_auto] items-end gap-2">
        <Field label={`Fill temperature, ${t}`} error={errors.fillTemperature}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.fillTemperature}
              className="num"
              inputMode="decimal"
              value={draft.fillTemperature}
              onChange={(e) => set({ fillTemperature: e.target.value })}
            />
          )}
        </Field>
        <Field label="Unit">
          {(id) => (
            <Select id={id} className="w-20" value={draft.temperatureUnit} onChange={(e) => set({ temperatureUnit: e.target.value as 'C' | 'F' })}>
              <option value="C">°C</option>
              <option value="F">°F</option>
            </Select>
          )}
        </Field>
      </div>
      <Field
        label={`Coldest the cylinder will get (filling, storage, transport), ${t}`}
        error={errors.minimumTemperature}
        hint="Empty: −20 °C is assumed. Condensation is screened at this temperature."
      >
        {(id, d) => (
          <Input
            id={id}
            aria-describedby={d}
            aria-invalid={!!errors.minimumTemperature}
            className="num"
            inputMode="decimal"
            value={draft.minimumTemperature}
            onChange={(e) => set({ minimumTemperature: e.target.value })}
          />
        )}
      </Field>
      <Field label="Local atmospheric pressure, bar absolute" error={errors.atmosphericBar} hint="Gauge targets are absolute minus this.">
        {(id, d) => (
          <Input
            id={id}
            aria-describedby={d}
            aria-invalid={!!errors.atmosphericBar}
            className="num"
            inputMode="decimal"
            value={draft.atmosphericBar}
            onChange={(e) => set({ atmosphericBar: e.target.value })}
          />
        )}
      </Field>
      <fieldset className="min-w-0 space-y-2">
        <legend className="text-sm font-medium text-ink-800">Gauge used for the readings (empty: the planner’s default)</legend>
        <div className="grid grid-cols-3 gap-2">
          <Field label="Span, bar" error={errors.gaugeSpanBar}>
            {(id, d) => (
              <Input
                id={id}
                aria-describedby={d}
                aria-invalid={!!errors.gaugeSpanBar}
                className="num"
                inputMode="decimal"
                value={draft.gaugeSpanBar}
                onChange={(e) => set({ gaugeSpanBar: e.target.value })}
              />
            )}
          </Field>
          <Field label="Class, % of span" error={errors.gaugeClass}>
            {(id, d) => (
              <Input
                id={id}
                aria-describedby={d}
                aria-invalid={!!errors.gaugeClass}
                className="num"
                inputMode="decimal"
                value={draft.gaugeClass}
                onChange={(e) => set({ gaugeClass: e.target.value })}
              />
            )}
          </Field>
          <Field label="Resolution, bar" error={errors.gaugeResolutionBar}>
            {(id, d) => (
              <Input
                id={id}
                aria-describedby={d}
                aria-invalid={!!errors.gaugeResolutionBar}
                className="num"
                inputMode="decimal"
                value={draft.gaugeResolutionBar}
                onChange={(e) => set({ gaugeResolutionBar: e.target.value })}
              />
            )}
          </Field>
        </div>
      </fieldset>
      <fieldset className="min-w-0 space-y-2">
        <legend className="text-sm font-medium text-ink-800">Parent gases</legend>
        {draft.sources.map((s, i) => (
          <div key={s.gas} className="flex flex-wrap items-center gap-2 text-sm">
            <span className="w-16 font-medium">{formulaOf(s.gas)}</span>
            <label className="sr-only" htmlFor={`src-kind-${i}`}>
              Source of {formulaOf(s.gas)}
            </label>
            <select
              id={`src-kind-${i}`}
              className={cn(inputClass, 'min-h-9')}
              value={s.kind}
              onChange={(e) => set({ sources: draft.sources.map((x, k) => (k === i ? { ...x, kind: e.target.value as 'pure' | 'premix' } : x)) })}
            >
              <option value="pure">pure gas</option>
              <option value="premix">premix in {formulaOf(balanceGas)}</option>
            </select>
            {s.kind === 'premix' && (
              <>
                <label className="sr-only" htmlFor={`src-amt-${i}`}>
                  Premix content of {formulaOf(s.gas)}
                </label>
                <input
                  id={`src-amt-${i}`}
                  className={cn(inputClass, 'num min-h-9 w-24 text-right')}
                  inputMode="decimal"
                  value={s.premixAmount}
                  aria-invalid={!!errors[`sources.${i}`]}
                  onChange={(e) => set({ sources: draft.sources.map((x, k) => (k === i ? { ...x, premixAmount: e.target.value } : x)) })}
                />
                <label className="sr-only" htmlFor={`src-unit-${i}`}>
                  Premix unit
                </label>
                <select
                  id={`src-unit-${i}`}
                  className={cn(inputClass, 'min-h-9')}
                  value={s.premixUnit}
                  onChange={(e) => set({ sources: draft.sources.map((x, k) => (k === i ? { ...x, premixUnit: e.target.value as 'percent' | 'ppm' } : x)) })}
                >
                  <option value="percent">mol %</option>
                  <option value="ppm">ppm</option>
                </select>
              </>
            )}
            {errors[`sources.${i}`] && (
              <span role="alert" className="w-full text-xs font-medium text-blocked-fg">
                {errors[`sources.${i}`]}
              </span>
            )}
          </div>
        ))}
        <p className="text-xs text-ink-600">Balance: pure {formulaOf(balanceGas)}.</p>
      </fieldset>
    </div>
  )
}
