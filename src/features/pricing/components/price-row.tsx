import { zodResolver } from '@hookform/resolvers/zod'
import { useId, useState } from 'react'
import { Controller, useForm } from 'react-hook-form'
import { type PriceEntry, type PriceEntryInput, PriceEntryInputSchema, PRICE_UNIT_LABEL, UNITS_BY_KIND } from '#shared/schemas/pricing.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Input, Select } from '#src/components/ui/field.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useDeletePrice } from '../api/delete-price.ts'
import { useSavePrice } from '../api/save-price.ts'
import { MoneyInput } from './money-input.tsx'

/** One editable line of the price book: label, unit (gases only) and price; saved on its own. */
export function PriceRow({ entry, keyLabel }: { entry: PriceEntry; keyLabel: string }) {
  const save = useSavePrice()
  const remove = useDeletePrice()
  const [confirmDelete, setConfirmDelete] = useState(false)
  // the inputs sit in other table cells; they join the row's form through the form attribute (Enter saves)
  const formId = useId()
  const defaults: PriceEntryInput = { kind: entry.kind, key: entry.key, label: entry.label, unit: entry.unit, priceMinor: entry.priceMinor }
  const form = useForm<PriceEntryInput>({ resolver: zodResolver(PriceEntryInputSchema), defaultValues: defaults })
  const { errors, isDirty } = form.formState
  const onSubmit = form.handleSubmit((input) =>
    save.mutate(
      { id: entry.id, input },
      {
        onSuccess: (saved) => form.reset({ kind: saved.kind, key: saved.key, label: saved.label, unit: saved.unit, priceMinor: saved.priceMinor }),
        onError: (err) => {
          if (err instanceof ApiError) for (const [f, message] of Object.entries(err.fieldErrors())) form.setError(f as keyof PriceEntryInput, { message })
        },
      },
    ),
  )
  const error =
    errors.label?.message ??
    errors.priceMinor?.message ??
    errors.unit?.message ??
    errors.key?.message ??
    (save.error && !(save.error instanceof ApiError && save.error.body.errors?.length)
      ? save.error instanceof ApiError
        ? save.error.body.detail
        : 'Not saved: the server could not be reached.'
      : null) ??
    (remove.error instanceof ApiError ? remove.error.body.detail : null)
  const units = UNITS_BY_KIND[entry.kind]
  return (
    <tr className="border-b border-ink-100 align-top">
      <th scope="row" className="py-1.5 pr-2 text-left text-sm font-medium text-ink-900">
        {keyLabel}
      </th>
      <td className="py-1.5 pr-2">
        <Input form={formId} aria-label={`Label for ${keyLabel}`} aria-invalid={!!errors.label} className="w-full min-w-48" {...form.register('label')} />
      </td>
      <td className="py-1.5 pr-2">
        {units.length > 1 ? (
          <Select form={formId} aria-label={`Unit for ${keyLabel}`} {...form.register('unit')}>
            {units.map((u) => (
              <option key={u} value={u}>
                {PRICE_UNIT_LABEL[u]}
              </option>
            ))}
          </Select>
        ) : (
          <span className="inline-block pt-2 text-sm text-ink-700">{PRICE_UNIT_LABEL[entry.unit]}</span>
        )}
      </td>
      <td className="py-1.5 pr-2">
        <Controller
          control={form.control}
          name="priceMinor"
          render={({ field }) => (
            <MoneyInput
              form={formId}
              aria-label={`Price for ${keyLabel}, ${entry.currency}`}
              aria-invalid={!!errors.priceMinor}
              className="num w-28 text-right"
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
            />
          )}
        />
      </td>
      <td className="py-1.5">
        <form id={formId} onSubmit={onSubmit} className="flex flex-wrap items-center gap-1.5">
          <Button type="submit" size="sm" disabled={!isDirty || save.isPending} aria-label={`Save ${keyLabel}`}>
            {save.isPending ? 'Saving…' : 'Save'}
          </Button>
          {confirmDelete ? (
            <>
              <Button
                size="sm"
                variant="danger"
                onClick={() => remove.mutate(entry.id)}
                disabled={remove.isPending}
                aria-label={`Confirm removing ${keyLabel}`}
              >
                Remove
              </Button>
              <Button size="sm" variant="ghost" onClick={() => setConfirmDelete(false)}>
                Keep
              </Button>
            </>
          ) : (
            <Button size="sm" variant="ghost" onClick={() => setConfirmDelete(true)} aria-label={`Remove ${keyLabel}`}>
              Remove…
            </Button>
          )}
        </form>
        {error && (
          <p role="alert" className="mt-1 text-xs font-medium text-blocked-fg">
            {error}
          </p>
        )}
      </td>
    </tr>
  )
}
