import type { UseFormRegisterReturn } from 'react-hook-form'
import { COMPOSITION_UNIT_LABEL, COMPOSITION_UNITS } from '#shared/schemas/quality.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'

export interface ResultRowGas {
  gas: string
  formula: string
  name: string
}

/**
 * The per-component inputs of an analysis (value, unit, expanded uncertainty, coverage factor, instrument, method),
 * one block per certified component. Works with any react-hook-form whose values hold `results[i]`.
 */
export function ResultRows({
  gases,
  field,
  errorOf,
}: {
  gases: ResultRowGas[]
  field: (path: string, options?: { valueAsNumber: true }) => UseFormRegisterReturn
  errorOf: (path: string) => string | undefined
}) {
  return (
    <div className="space-y-4">
      {gases.map((g, i) => {
        const p = (name: string) => `results.${i}.${name}`
        const err = (name: string) => errorOf(p(name))
        return (
          <fieldset key={g.gas} className="rounded-md border border-ink-200 p-3">
            <legend className="px-1">
              <GasChip formula={g.formula} name={g.name} showName />
            </legend>
            <input type="hidden" {...field(p('gas'))} />
            <div className="grid gap-3 sm:grid-cols-4">
              <Field label={`Analysed value, ${g.formula}`} error={err('value')}>
                {(id, d) => (
                  <Input
                    id={id}
                    aria-describedby={d}
                    aria-invalid={!!err('value')}
                    type="number"
                    step="any"
                    inputMode="decimal"
                    className="num"
                    {...field(p('value'), { valueAsNumber: true })}
                  />
                )}
              </Field>
              <Field label="Unit" error={err('unit')}>
                {(id, d) => (
                  <Select id={id} aria-describedby={d} {...field(p('unit'))}>
                    {COMPOSITION_UNITS.map((u) => (
                      <option key={u} value={u}>
                        {COMPOSITION_UNIT_LABEL[u]}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Expanded uncertainty U (±, same unit)" error={err('expandedUncertainty')}>
                {(id, d) => (
                  <Input
                    id={id}
                    aria-describedby={d}
                    aria-invalid={!!err('expandedUncertainty')}
                    type="number"
                    step="any"
                    inputMode="decimal"
                    className="num"
                    {...field(p('expandedUncertainty'), { valueAsNumber: true })}
                  />
                )}
              </Field>
              <Field label="Coverage factor k" error={err('coverageFactor')} hint="2 ≈ 95 % coverage">
                {(id, d) => (
                  <Input
                    id={id}
                    aria-describedby={d}
                    aria-invalid={!!err('coverageFactor')}
                    type="number"
                    step="any"
                    inputMode="decimal"
                    className="num"
                    {...field(p('coverageFactor'), { valueAsNumber: true })}
                  />
                )}
              </Field>
            </div>
            <div className="mt-3 grid gap-3 sm:grid-cols-2">
              <Field label="Instrument" error={err('instrument')}>
                {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!err('instrument')} autoComplete="off" {...field(p('instrument'))} />}
              </Field>
              <Field label="Analytical method" error={err('method')} hint="e.g. NDIR, two-point bracketing (ISO 12963)">
                {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!err('method')} autoComplete="off" {...field(p('method'))} />}
              </Field>
            </div>
          </fieldset>
        )
      })}
    </div>
  )
}
