import { zodResolver } from '@hookform/resolvers/zod'
import { type FieldPath, useForm } from 'react-hook-form'
import type { z } from 'zod'
import { type CertificateDetail, CorrectionInputSchema, fromMoleFraction } from '#shared/schemas/quality.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, inputClass } from '#src/components/ui/field.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { useCorrectCertificate } from '../api/correct-certificate.ts'
import { ResultRows } from './result-rows.tsx'

type FormIn = z.input<typeof CorrectionInputSchema>
type FormOut = z.output<typeof CorrectionInputSchema>

function monthsBetween(from: string, to: string): number {
  const [y1, m1] = from.split('-').map(Number)
  const [y2, m2] = to.split('-').map(Number)
  return (y2 - y1) * 12 + (m2 - m1)
}

/** A correction issues the next revision with the reason; the released revision stays as it was. */
export function CorrectionForm({ certificate, onDone }: { certificate: CertificateDetail; onDone: (newId: number) => void }) {
  const correct = useCorrectCertificate(certificate.id)
  const c = certificate.content
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(CorrectionInputSchema),
    defaultValues: {
      password: '',
      reason: '',
      results: c.composition.map((r) => ({
        gas: r.gas,
        value: fromMoleFraction(r.fraction, r.unit),
        unit: r.unit,
        expandedUncertainty: fromMoleFraction(r.expandedUncertainty, r.unit),
        coverageFactor: r.coverageFactor,
        instrument: r.instrument,
        method: r.method,
      })),
      validityMonths: monthsBetween(c.dates.certifiedOn, c.dates.validUntil),
      minimumUsePressureBarGauge: c.filling.minimumUsePressureBarGauge,
      storageMinC: c.filling.storageMinC,
      storageMaxC: c.filling.storageMaxC,
    },
  })
  const errorOf = (path: string) => (form.getFieldState(path as FieldPath<FormIn>, form.formState).error?.message as string | undefined) ?? undefined
  const onSubmit = form.handleSubmit((input) =>
    correct.mutate(input, {
      onSuccess: (r) => onDone(r.certificate.id),
      onError: (err) => {
        form.setValue('password', '')
        if (err instanceof ApiError) for (const [f, message] of Object.entries(err.fieldErrors())) form.setError(f as FieldPath<FormIn>, { message })
      },
    }),
  )
  const num = (name: 'validityMonths' | 'minimumUsePressureBarGauge' | 'storageMinC' | 'storageMaxC') => form.register(name, { valueAsNumber: true })
  const problem =
    correct.error instanceof ApiError && !correct.error.body.errors?.length
      ? correct.error.body.detail
      : correct.error && !(correct.error instanceof ApiError)
        ? 'Could not reach the server; nothing changed. Try again.'
        : null

  if (!certificate.current) {
    return (
      <p className="flex items-center gap-2 text-sm">
        <SafetyBadge state="caution" label={`Superseded by rev. ${certificate.supersededByRevision}`} /> Correct the current revision instead.
      </p>
    )
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Correct ${certificate.number}`} className="space-y-4">
      <p className="text-sm text-ink-700">
        Revision {certificate.revision} stays as released and is marked superseded; the customer gets revision {certificate.revision + 1} by e-mail.
      </p>
      <Field label="What is corrected, and why" error={errorOf('reason')}>
        {(id, d) => (
          <textarea id={id} rows={2} aria-describedby={d} aria-invalid={!!errorOf('reason')} className={cn(inputClass, 'py-2')} {...form.register('reason')} />
        )}
      </Field>
      <ResultRows
        gases={c.composition.map((r) => ({ gas: r.gas, formula: r.formula, name: r.name }))}
        field={(p, o) => form.register(p as FieldPath<FormIn>, o)}
        errorOf={errorOf}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Valid for (months from certification)" error={errorOf('validityMonths')}>
          {(id, d) => <Input id={id} aria-describedby={d} type="number" inputMode="numeric" className="num" {...num('validityMonths')} />}
        </Field>
        <Field label="Do not use below (bar gauge)" error={errorOf('minimumUsePressureBarGauge')}>
          {(id, d) => <Input id={id} aria-describedby={d} type="number" step="any" className="num" {...num('minimumUsePressureBarGauge')} />}
        </Field>
        <Field label="Store and use from (°C)" error={errorOf('storageMinC')}>
          {(id, d) => <Input id={id} aria-describedby={d} type="number" step="any" className="num" {...num('storageMinC')} />}
        </Field>
        <Field label="Store and use up to (°C)" error={errorOf('storageMaxC')}>
          {(id, d) => <Input id={id} aria-describedby={d} type="number" step="any" className="num" {...num('storageMaxC')} />}
        </Field>
      </div>
      <Field label="Your password (signature)" error={errorOf('password')}>
        {(id, d) => (
          <Input
            id={id}
            aria-describedby={d}
            aria-invalid={!!errorOf('password')}
            type="password"
            autoComplete="current-password"
            {...form.register('password')}
          />
        )}
      </Field>
      {problem && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {problem}
        </p>
      )}
      <Button type="submit" disabled={correct.isPending}>
        {correct.isPending ? 'Signing…' : `Sign and issue revision ${certificate.revision + 1}`}
      </Button>
    </form>
  )
}
