import { zodResolver } from '@hookform/resolvers/zod'
import { Controller, useForm } from 'react-hook-form'
import { GASES } from '#shared/physics/index.ts'
import {
  HAZARD_LABEL,
  HAZARD_SURCHARGE_KEYS,
  PRICE_UNIT_LABEL,
  type PriceEntryInput,
  PriceEntryInputSchema,
  type PriceKind,
  UNITS_BY_KIND,
} from '#shared/schemas/pricing.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useSavePrice } from '../api/save-price.ts'
import { MoneyInput } from './money-input.tsx'

const KEY_HINT: Record<PriceKind, string> = {
  gas: 'A gas of the gas library',
  rental: 'Largest water volume of the class, e.g. 50L',
  certification: 'Relative expanded uncertainty of the class in %, e.g. 1',
  surcharge: 'The hazard it applies to',
}

/** Adds one line to a section of the price book. `taken` are the keys the section already has. */
export function AddPriceForm({ kind, taken }: { kind: PriceKind; taken: ReadonlySet<string> }) {
  const save = useSavePrice()
  const defaults: PriceEntryInput = { kind, key: '', label: '', unit: UNITS_BY_KIND[kind][0], priceMinor: Number.NaN }
  const form = useForm<PriceEntryInput>({ resolver: zodResolver(PriceEntryInputSchema), defaultValues: defaults })
  const { errors } = form.formState
  const onSubmit = form.handleSubmit((input) =>
    save.mutate(
      { id: null, input },
      {
        onSuccess: () => form.reset(defaults),
        onError: (err) => {
          if (err instanceof ApiError) for (const [f, message] of Object.entries(err.fieldErrors())) form.setError(f as keyof PriceEntryInput, { message })
        },
      },
    ),
  )
  const keyField = form.register('key', {
    onChange: (e: { target: { value: string } }) => {
      if (form.getValues('label')) return
      const v = e.target.value
      const gas = GASES.find((g) => g.id === v)
      if (kind === 'gas' && gas) form.setValue('label', gas.name)
      if (kind === 'surcharge' && v in HAZARD_LABEL) form.setValue('label', HAZARD_LABEL[v as keyof typeof HAZARD_LABEL])
    },
  })
  const serverError =
    save.error && !(save.error instanceof ApiError && save.error.body.errors?.length)
      ? save.error instanceof ApiError
        ? save.error.body.detail
        : 'Not saved: the server could not be reached.'
      : null
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="mt-3 grid items-start gap-2 rounded-md bg-ink-50 p-3 sm:grid-cols-[12rem_1fr_auto_8rem_auto]"
      aria-label={`Add a ${kind} price`}
    >
      <Field
        label={kind === 'gas' ? 'Gas' : kind === 'rental' ? 'Size class' : kind === 'certification' ? 'Class (U, %)' : 'Hazard'}
        hint={KEY_HINT[kind]}
        error={errors.key?.message}
      >
        {(id, d) =>
          kind === 'gas' ? (
            <Select id={id} aria-describedby={d} aria-invalid={!!errors.key} {...keyField}>
              <option value="">Choose a gas…</option>
              {GASES.filter((g) => !taken.has(g.id)).map((g) => (
                <option key={g.id} value={g.id}>
                  {g.id === 'air' ? 'Air — synthetic (N2/O2/Ar)' : `${g.formula} — ${g.name}`}
                </option>
              ))}
            </Select>
          ) : kind === 'surcharge' ? (
            <Select id={id} aria-describedby={d} aria-invalid={!!errors.key} {...keyField}>
              <option value="">Choose a hazard…</option>
              {HAZARD_SURCHARGE_KEYS.filter((k) => !taken.has(k)).map((k) => (
                <option key={k} value={k}>
                  {HAZARD_LABEL[k]}
                </option>
              ))}
            </Select>
          ) : (
            <Input id={id} aria-describedby={d} aria-invalid={!!errors.key} placeholder={kind === 'rental' ? '50L' : '1'} {...keyField} />
          )
        }
      </Field>
      <Field label="Label" error={errors.label?.message}>
        {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.label} {...form.register('label')} />}
      </Field>
      <Field label="Unit" error={errors.unit?.message}>
        {(id, d) =>
          UNITS_BY_KIND[kind].length > 1 ? (
            <Select id={id} aria-describedby={d} {...form.register('unit')}>
              {UNITS_BY_KIND[kind].map((u) => (
                <option key={u} value={u}>
                  {PRICE_UNIT_LABEL[u]}
                </option>
              ))}
            </Select>
          ) : (
            <Input id={id} aria-describedby={d} readOnly value={PRICE_UNIT_LABEL[UNITS_BY_KIND[kind][0]]} />
          )
        }
      </Field>
      <Field label="Price" error={errors.priceMinor ? 'Enter an amount like 4.20' : undefined}>
        {(id, d) => (
          <Controller
            control={form.control}
            name="priceMinor"
            render={({ field }) => (
              <MoneyInput
                id={id}
                aria-describedby={d}
                aria-invalid={!!errors.priceMinor}
                className="num text-right"
                value={field.value}
                onChange={field.onChange}
                onBlur={field.onBlur}
              />
            )}
          />
        )}
      </Field>
      <div className="sm:pt-6">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Adding…' : 'Add'}
        </Button>
      </div>
      {serverError && (
        <p role="alert" className="text-sm text-blocked-fg sm:col-span-5">
          {serverError}
        </p>
      )}
    </form>
  )
}
