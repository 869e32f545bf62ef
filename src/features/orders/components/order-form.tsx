import { zodResolver } from '@hookform/resolvers/zod'
import { useForm, useFieldArray, useWatch } from 'react-hook-form'
import type { Customer } from '#shared/schemas/customer.ts'
import { DEFAULT_RENTAL_DAYS, type OrderInput, OrderInputSchema, type OrderLineInput } from '#shared/schemas/order.ts'
import type { PriceBook } from '#shared/schemas/pricing.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, inputClass, Select } from '#src/components/ui/field.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { LineEditor } from './line-editor.tsx'
import { QuoteSummary } from './quote-summary.tsx'

export const EMPTY_LINE: OrderLineInput = {
  description: '',
  components: [{ gas: '', amount: Number.NaN, unit: 'percent' }],
  balanceGas: 'nitrogen',
  blendTolerancePct: 5,
  certificationUncertaintyPct: 2,
  waterVolumeL: 10,
  valveOutlet: '',
  quantity: 1,
  finalPressureBarGauge: 150,
  method: 'partial-pressure',
}

export function emptyOrder(customerId?: number): OrderInput {
  return { customerId: customerId ?? Number.NaN, reference: '', neededBy: null, rentalDays: DEFAULT_RENTAL_DAYS, notes: '', lines: [EMPTY_LINE] }
}

export type SubmitIntent = 'save' | 'send'

/**
 * The quote builder: customer and commercial details, one or more mixtures, and the price adding up beside them.
 * Server field errors (e.g. a gas without a price) are put back on their fields.
 */
export function OrderForm({
  defaultValues,
  customers,
  book,
  busy,
  error,
  onSubmit,
  onCancel,
}: {
  defaultValues: OrderInput
  customers: Customer[]
  book: PriceBook
  busy: boolean
  error: unknown
  onSubmit: (input: OrderInput, intent: SubmitIntent, form: { setServerErrors: (err: unknown) => void }) => void
  onCancel: () => void
}) {
  const form = useForm<OrderInput>({ resolver: zodResolver(OrderInputSchema), defaultValues })
  const lines = useFieldArray({ control: form.control, name: 'lines' })
  const values = useWatch({ control: form.control })
  const { errors } = form.formState

  const setServerErrors = (err: unknown) => {
    if (!(err instanceof ApiError)) return
    for (const [field, message] of Object.entries(err.fieldErrors())) form.setError(field as keyof OrderInput, { message })
  }
  const submit = (intent: SubmitIntent) => form.handleSubmit((input) => onSubmit(input, intent, { setServerErrors }))
  const generalError =
    error instanceof ApiError ? error.body.detail : error ? 'Could not reach the server; nothing was saved. Your entries are still here; try again.' : null

  return (
    <form onSubmit={submit('save')} noValidate className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(20rem,2fr)]" aria-label="Specification and quote">
      <div className="space-y-4">
        <div className="grid gap-3 rounded-card border border-ink-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4">
          <Field label="Customer" error={errors.customerId?.message} className="sm:col-span-2">
            {(id, d) => (
              <Select id={id} aria-describedby={d} aria-invalid={!!errors.customerId} {...form.register('customerId', { valueAsNumber: true })}>
                <option value="">Choose the customer…</option>
                {customers.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.code} — {c.company}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          <Field label="Customer reference" error={errors.reference?.message} hint="PO number or project">
            {(id, d) => <Input id={id} aria-describedby={d} {...form.register('reference')} />}
          </Field>
          <Field label="Needed by" error={errors.neededBy?.message}>
            {(id, d) => (
              <Input
                id={id}
                type="date"
                aria-describedby={d}
                aria-invalid={!!errors.neededBy}
                {...form.register('neededBy', { setValueAs: (v: string | null) => v || null })}
              />
            )}
          </Field>
          <Field label="Rental included, days" error={errors.rentalDays?.message} hint="Charged per day after that">
            {(id, d) => (
              <Input
                id={id}
                aria-describedby={d}
                aria-invalid={!!errors.rentalDays}
                inputMode="numeric"
                className="num"
                {...form.register('rentalDays', { valueAsNumber: true })}
              />
            )}
          </Field>
          <Field label="Notes for the shop" error={errors.notes?.message} className="sm:col-span-2 lg:col-span-3">
            {(id, d) => <textarea id={id} rows={2} aria-describedby={d} className={cn(inputClass, 'py-2')} {...form.register('notes')} />}
          </Field>
        </div>

        {lines.fields.map((f, i) => (
          <LineEditor key={f.id} form={form} index={i} canRemove={lines.fields.length > 1} onRemove={() => lines.remove(i)} />
        ))}
        {errors.lines?.message && <p className="text-sm font-medium text-blocked-fg">{errors.lines.message}</p>}
        <Button variant="secondary" onClick={() => lines.append({ ...EMPTY_LINE, components: [{ gas: '', amount: Number.NaN, unit: 'percent' }] })}>
          Add another mixture
        </Button>

        {generalError && (
          <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
            {generalError}
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" disabled={busy}>
            {busy ? 'Saving…' : 'Save specification'}
          </Button>
          <Button variant="secondary" disabled={busy} onClick={submit('send')}>
            Save and send quote
          </Button>
          <Button variant="ghost" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </div>
      <aside className="xl:sticky xl:top-20 xl:self-start">
        <QuoteSummary values={values} book={book} />
      </aside>
    </form>
  )
}
