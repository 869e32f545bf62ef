import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { useNavigate, useSearchParams } from 'react-router-dom'
import { type LoginInput, LoginInputSchema } from '#shared/schemas/auth.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input } from '#src/components/ui/field.tsx'
import { Logo } from '#src/components/logo.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useSignIn } from '../api/sign-in.ts'

export function Component() {
  const navigate = useNavigate()
  const [search] = useSearchParams()
  const signIn = useSignIn()
  const form = useForm<LoginInput>({ resolver: zodResolver(LoginInputSchema), defaultValues: { email: '', password: '' } })
  const onSubmit = form.handleSubmit((values) =>
    signIn.mutate(values, {
      onSuccess: () => {
        const next = search.get('next')
        navigate(next?.startsWith('/') && !next.startsWith('//') ? next : '/', { replace: true })
      },
    }),
  )
  const error =
    signIn.error instanceof ApiError ? signIn.error.body.detail : signIn.error ? 'Could not reach the server. Check the connection and try again.' : null
  return (
    <main className="grid min-h-screen place-items-center bg-ink-900 px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center justify-center gap-3 text-white">
          <Logo className="size-10" />
          <div>
            <p className="text-2xl font-semibold tracking-tight">Fillwright</p>
            <p className="text-xs text-ink-300">Specification to certificate, one cylinder at a time</p>
          </div>
        </div>
        <form onSubmit={onSubmit} noValidate className="space-y-4 rounded-card bg-white p-6 shadow-xl">
          <h1 className="text-lg font-semibold">Sign in</h1>
          <Field label="E-mail" error={form.formState.errors.email?.message}>
            {(id, d) => (
              <Input
                id={id}
                aria-describedby={d}
                aria-invalid={!!form.formState.errors.email}
                type="email"
                autoComplete="username"
                autoFocus
                {...form.register('email')}
              />
            )}
          </Field>
          <Field label="Password" error={form.formState.errors.password?.message}>
            {(id, d) => (
              <Input
                id={id}
                aria-describedby={d}
                aria-invalid={!!form.formState.errors.password}
                type="password"
                autoComplete="current-password"
                {...form.register('password')}
              />
            )}
          </Field>
          {error && (
            <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
              {error}
            </p>
          )}
          <Button type="submit" className="w-full" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
        </form>
        <p className="mt-4 text-center text-xs text-ink-400">
          Demo accounts: admin, sales, blender, technician, qa or customer @demo.test — password in the README.
        </p>
      </div>
    </main>
  )
}
