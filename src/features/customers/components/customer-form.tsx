import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { type Customer, type CustomerInput, CustomerInputSchema, EMPTY_CUSTOMER_INPUT } from '#shared/schemas/customer.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, inputClass } from '#src/components/ui/field.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { useSaveCustomer } from '../api/save-customer.ts'

const FIELDS: (keyof CustomerInput)[] = ['code', 'company', 'contactName', 'contactEmail', 'phone', 'billingAddress']

/** Create or edit one customer; server field errors land next to their fields. Give it a `key` per customer. */
export function CustomerForm({ customer, onDone, onCancel }: { customer: Customer | null; onDone: (c: Customer) => void; onCancel: () => void }) {
  const save = useSaveCustomer()
  const defaults: CustomerInput = customer
    ? {
        code: customer.code,
        company: customer.company,
        contactName: customer.contactName,
        contactEmail: customer.contactEmail,
        phone: customer.phone,
        billingAddress: customer.billingAddress,
      }
    : EMPTY_CUSTOMER_INPUT
  const form = useForm<CustomerInput>({ resolver: zodResolver(CustomerInputSchema), defaultValues: defaults })
  const { errors } = form.formState

  const onSubmit = form.handleSubmit((input) =>
    save.mutate(
      { id: customer?.id ?? null, input },
      {
        onSuccess: (saved) => {
          form.reset(form.getValues())
          onDone(saved)
        },
        onError: (err) => {
          if (err instanceof ApiError) {
            for (const [field, message] of Object.entries(err.fieldErrors())) {
              if ((FIELDS as string[]).includes(field)) form.setError(field as keyof CustomerInput, { message })
            }
          }
        },
      },
    ),
  )
  const serverError =
    save.error instanceof ApiError && !save.error.body.errors?.length
      ? save.error.body.detail
      : save.error && !(save.error instanceof ApiError)
        ? 'Could not reach the server; nothing was saved. Try again.'
        : null

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label={customer ? `Edit ${customer.company}` : 'New customer'}>
      <div className="grid gap-3 sm:grid-cols-[8rem_1fr]">
        <Field label="Code" error={errors.code?.message} hint="Short handle, e.g. ALDB">
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.code} autoComplete="off" className="uppercase" {...form.register('code')} />}
        </Field>
        <Field label="Company" error={errors.company?.message}>
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.company} autoComplete="organization" {...form.register('company')} />}
        </Field>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Contact person" error={errors.contactName?.message}>
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.contactName} autoComplete="name" {...form.register('contactName')} />}
        </Field>
        <Field label="Contact e-mail" error={errors.contactEmail?.message} hint="Quotes are e-mailed here">
          {(id, d) => (
            <Input id={id} type="email" aria-describedby={d} aria-invalid={!!errors.contactEmail} autoComplete="email" {...form.register('contactEmail')} />
          )}
        </Field>
      </div>
      <Field label="Phone" error={errors.phone?.message}>
        {(id, d) => <Input id={id} type="tel" aria-describedby={d} aria-invalid={!!errors.phone} autoComplete="tel" {...form.register('phone')} />}
      </Field>
      <Field label="Billing address" error={errors.billingAddress?.message}>
        {(id, d) => (
          <textarea
            id={id}
            rows={3}
            aria-describedby={d}
            aria-invalid={!!errors.billingAddress}
            className={cn(inputClass, 'py-2')}
            {...form.register('billingAddress')}
          />
        )}
      </Field>
      {serverError && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {serverError}
        </p>
      )}
      {save.isSuccess && !form.formState.isDirty && (
        <p role="status" className="text-sm text-clear-fg">
          Saved.
        </p>
      )}
      <div className="flex gap-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : customer ? 'Save customer' : 'Add customer'}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  )
}
