import { Controller, type FieldErrors, type UseFormReturn, useFieldArray } from 'react-hook-form'
import { GASES } from '#shared/physics/index.ts'
import { COMPONENT_UNIT_LABEL, COMPONENT_UNITS, FILL_METHOD_LABEL, FILL_METHODS, type OrderInput } from '#shared/schemas/order.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { PressureGaugeInput } from './pressure-input.tsx'

const PRESSURE_UNIT_WORD = { bar: 'bar gauge', psi: 'psig', kPa: 'kPa gauge' } as const

function GasOptions() {
  return (
    <>
      <option value="">Choose…</option>
      {GASES.map((g) => (
        <option key={g.id} value={g.id}>
          {g.id === 'air' ? 'Air — synthetic (N2/O2/Ar)' : `${g.formula} — ${g.name}`}
        </option>
      ))}
    </>
  )
}

function arrayMessage(e: unknown): string | undefined {
  const x = e as { message?: string; root?: { message?: string } } | undefined
  return x?.message ?? x?.root?.message
}

/** One mixture specification of the quote: components with amounts and units, balance gas, cylinder and fill. */
export function LineEditor({ form, index, onRemove, canRemove }: { form: UseFormReturn<OrderInput>; index: number; onRemove: () => void; canRemove: boolean }) {
  const { units } = useDisplayUnits()
  const components = useFieldArray({ control: form.control, name: `lines.${index}.components` })
  const errors = (form.formState.errors.lines?.[index] ?? {}) as FieldErrors<OrderInput['lines'][number]>
  const reg = form.register
  const p = `lines.${index}` as const
  return (
    <fieldset className="rounded-md border border-ink-200 p-3">
      <legend className="px-1 text-sm font-semibold text-ink-900">Mixture {index + 1}</legend>
      <div className="space-y-2">
        <div className="grid grid-cols-[minmax(0,1fr)_7rem_9rem_auto] items-end gap-2 text-xs font-medium text-ink-700" aria-hidden="true">
          <span>Component</span>
          <span>Amount</span>
          <span>Unit (amount fraction)</span>
          <span />
        </div>
        {components.fields.map((f, j) => {
          const ce = errors.components?.[j]
          return (
            <div key={f.id} className="grid grid-cols-[minmax(0,1fr)_7rem_9rem_auto] items-start gap-2">
              <div>
                <Select
                  aria-label={`Mixture ${index + 1}, component ${j + 1}: gas`}
                  aria-invalid={!!ce?.gas}
                  className="w-full"
                  {...reg(`${p}.components.${j}.gas`)}
                >
                  <GasOptions />
                </Select>
                {ce?.gas?.message && <p className="mt-0.5 text-xs font-medium text-blocked-fg">{ce.gas.message}</p>}
              </div>
              <div>
                <Input
                  aria-label={`Mixture ${index + 1}, component ${j + 1}: amount`}
                  aria-invalid={!!ce?.amount}
                  inputMode="decimal"
                  className="num w-full text-right"
                  {...reg(`${p}.components.${j}.amount`, { valueAsNumber: true })}
                />
                {ce?.amount?.message && <p className="mt-0.5 text-xs font-medium text-blocked-fg">{ce.amount.message}</p>}
              </div>
              <Select aria-label={`Mixture ${index + 1}, component ${j + 1}: unit`} {...reg(`${p}.components.${j}.unit`)}>
                {COMPONENT_UNITS.map((u) => (
                  <option key={u} value={u}>
                    {COMPONENT_UNIT_LABEL[u]}
                  </option>
                ))}
              </Select>
              <Button
                variant="ghost"
                size="sm"
                className="mt-1"
                onClick={() => components.remove(j)}
                aria-label={`Remove component ${j + 1} of mixture ${index + 1}`}
              >
                Remove
              </Button>
            </div>
          )
        })}
        {arrayMessage(errors.components) && (
          <p role="alert" className="text-xs font-medium text-blocked-fg">
            {arrayMessage(errors.components)}
          </p>
        )}
        <Button variant="secondary" size="sm" onClick={() => components.append({ gas: '', amount: Number.NaN, unit: 'percent' })}>
          Add component
        </Button>
      </div>

      <div className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Field label="Balance gas" error={errors.balanceGas?.message} hint="Makes up the rest">
          {(id, d) => (
            <Select id={id} aria-describedby={d} aria-invalid={!!errors.balanceGas} {...reg(`${p}.balanceGas`)}>
              <GasOptions />
            </Select>
          )}
        </Field>
        <Field label="Cylinder water volume, L" error={errors.waterVolumeL?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.waterVolumeL}
              inputMode="decimal"
              className="num"
              {...reg(`${p}.waterVolumeL`, { valueAsNumber: true })}
            />
          )}
        </Field>
        <Field label={`Fill pressure, ${PRESSURE_UNIT_WORD[units.pressure]} at 15 °C`} error={errors.finalPressureBarGauge?.message} hint="Settled pressure">
          {(id, d) => (
            <Controller
              control={form.control}
              name={`${p}.finalPressureBarGauge`}
              render={({ field }) => (
                <PressureGaugeInput
                  key={units.pressure}
                  id={id}
                  aria-describedby={d}
                  aria-invalid={!!errors.finalPressureBarGauge}
                  className="num"
                  unit={units.pressure}
                  value={field.value}
                  onChange={field.onChange}
                  onBlur={field.onBlur}
                />
              )}
            />
          )}
        </Field>
        <Field label="Number of cylinders" error={errors.quantity?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.quantity}
              inputMode="numeric"
              className="num"
              {...reg(`${p}.quantity`, { valueAsNumber: true })}
            />
          )}
        </Field>
        <Field label="Blend tolerance, % relative" error={errors.blendTolerancePct?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.blendTolerancePct}
              inputMode="decimal"
              className="num"
              {...reg(`${p}.blendTolerancePct`, { valueAsNumber: true })}
            />
          )}
        </Field>
        <Field label="Certification uncertainty, % relative (k = 2)" error={errors.certificationUncertaintyPct?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.certificationUncertaintyPct}
              inputMode="decimal"
              className="num"
              {...reg(`${p}.certificationUncertaintyPct`, { valueAsNumber: true })}
            />
          )}
        </Field>
        <Field label="Valve outlet" error={errors.valveOutlet?.message}>
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.valveOutlet} placeholder="e.g. DIN 477 No. 14" {...reg(`${p}.valveOutlet`)} />}
        </Field>
        <Field label="Method" error={errors.method?.message}>
          {(id, d) => (
            <Select id={id} aria-describedby={d} {...reg(`${p}.method`)}>
              {FILL_METHODS.map((m) => (
                <option key={m} value={m}>
                  {FILL_METHOD_LABEL[m]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field
          label="Description on the quote (optional)"
          error={errors.description?.message}
          hint="Written from the composition when empty"
          className="sm:col-span-2 lg:col-span-4"
        >
          {(id, d) => <Input id={id} aria-describedby={d} {...reg(`${p}.description`)} />}
        </Field>
      </div>
      {canRemove && (
        <div className="mt-3 text-right">
          <Button variant="ghost" size="sm" onClick={onRemove}>
            Remove mixture {index + 1}
          </Button>
        </div>
      )}
    </fieldset>
  )
}
