import { zodResolver } from '@hookform/resolvers/zod'
import { useQuery } from '@tanstack/react-query'
import { useForm } from 'react-hook-form'
import { z } from 'zod'
import { ROLES } from '#shared/schemas/auth.ts'
import { CustomerListSchema } from '#shared/schemas/customer.ts'
import { PasswordSchema, type User, UserCreateInputSchema, UserUpdateInputSchema } from '#shared/schemas/user.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { ApiError, apiClient } from '#src/lib/api-client.ts'
import { useCreateUser, useResetPassword, useUpdateUser } from '../api/user-queries.ts'

const ROLE_HELP: Record<string, string> = {
  admin: 'accounts, everything',
  sales: 'customers, quotes, orders, invoices',
  blender: 'fill plans, cylinders',
  technician: 'fill runs at the manifold',
  qa: 'analysis, certificate release',
  customer: 'own orders and documents',
}

const FormSchema = z.object({
  email: z.string(),
  name: z.string(),
  roles: z.array(z.enum(ROLES)),
  customerId: z.string(),
  active: z.boolean(),
  password: z.string(),
})
type FormValues = z.infer<typeof FormSchema>

/** Create or edit an account. New accounts get a first password; existing ones can get a new one. */
export function UserForm({ user, onDone }: { user: User | null; onDone: () => void }) {
  const customers = useQuery({ queryKey: ['customers', 'list', { q: '' }], queryFn: () => apiClient.get('/api/customers', CustomerListSchema) })
  const create = useCreateUser()
  const update = useUpdateUser(user?.id ?? 0)
  const reset = useResetPassword(user?.id ?? 0)
  const form = useForm<FormValues>({
    resolver: zodResolver(FormSchema),
    defaultValues: {
      email: user?.email ?? '',
      name: user?.name ?? '',
      roles: user?.roles ?? [],
      customerId: user?.customerId ? String(user.customerId) : '',
      active: user?.active ?? true,
      password: '',
    },
  })
  const roles = form.watch('roles')
  const errors = form.formState.errors

  const onSubmit = form.handleSubmit(async (v) => {
    const customerId = v.customerId ? Number(v.customerId) : null
    const parsed = user
      ? UserUpdateInputSchema.safeParse({ name: v.name, roles: v.roles, customerId, active: v.active })
      : UserCreateInputSchema.safeParse({ email: v.email, name: v.name, roles: v.roles, customerId, password: v.password })
    if (!parsed.success) {
      for (const issue of parsed.error.issues) form.setError(String(issue.path[0]) as keyof FormValues, { message: issue.message })
      return
    }
    try {
      if (user) {
        await update.mutateAsync(parsed.data as z.infer<typeof UserUpdateInputSchema>)
        if (v.password) {
          const pw = PasswordSchema.safeParse(v.password)
          if (!pw.success) return form.setError('password', { message: pw.error.issues[0]?.message })
          await reset.mutateAsync(v.password)
        }
      } else {
        await create.mutateAsync(parsed.data as z.infer<typeof UserCreateInputSchema>)
      }
      onDone()
    } catch (err) {
      if (err instanceof ApiError) {
        const fields = err.fieldErrors()
        for (const [k, m] of Object.entries(fields)) form.setError(k as keyof FormValues, { message: m })
        if (!Object.keys(fields).length) form.setError('root', { message: err.body.detail })
      } else form.setError('root', { message: 'Could not reach the server; nothing was saved. Try again.' })
    }
  })

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      <Field label="E-mail (sign-in name)" error={errors.email?.message}>
        {(id, d) => <Input id={id} aria-describedby={d} type="email" disabled={!!user} {...form.register('email')} />}
      </Field>
      <Field label="Name" error={errors.name?.message}>
        {(id, d) => <Input id={id} aria-describedby={d} {...form.register('name')} />}
      </Field>
      <fieldset>
        <legend className="text-sm font-medium text-ink-800">Roles</legend>
        <div className="mt-1 grid gap-1 sm:grid-cols-2">
          {ROLES.map((r) => (
            <label key={r} className="flex items-start gap-2 rounded border border-ink-200 px-2 py-1.5 text-sm">
              <input type="checkbox" value={r} className="mt-0.5 size-4" {...form.register('roles')} />
              <span>
                <span className="font-medium">{r}</span>
                <span className="block text-xs text-ink-600">{ROLE_HELP[r]}</span>
              </span>
            </label>
          ))}
        </div>
        {errors.roles && (
          <p className="mt-1 text-xs font-medium text-blocked-fg" role="alert">
            {errors.roles.message}
          </p>
        )}
      </fieldset>
      {roles.includes('customer') && (
        <Field label="Customer company" error={errors.customerId?.message}>
          {(id, d) => (
            <Select id={id} aria-describedby={d} {...form.register('customerId')}>
              <option value="">Choose…</option>
              {customers.data?.items.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.company}
                </option>
              ))}
            </Select>
          )}
        </Field>
      )}
      {user && (
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" className="size-4" {...form.register('active')} /> Active (may sign in)
        </label>
      )}
      <Field
        label={user ? 'New password (leave empty to keep)' : 'First password'}
        hint="At least 10 characters. Tell the person in person, not by e-mail."
        error={errors.password?.message}
      >
        {(id, d) => <Input id={id} aria-describedby={d} type="password" autoComplete="new-password" {...form.register('password')} />}
      </Field>
      {errors.root && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {errors.root.message}
        </p>
      )}
      <div className="flex gap-2">
        <Button type="submit" disabled={form.formState.isSubmitting}>
          {user ? 'Save account' : 'Create account'}
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  )
}
