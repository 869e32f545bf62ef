import { zodResolver } from '@hookform/resolvers/zod'
import { type FieldPath, useForm } from 'react-hook-form'
import { type QaRunDetail, type ReleaseInput, ReleaseInputSchema, type ReleaseResult } from '#shared/schemas/quality.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input } from '#src/components/ui/field.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { certificatePdfHref, previewHref } from '../api/quality-queries.ts'
import { useReleaseCertificate } from '../api/release-certificate.ts'

/** Release: the signer confirms the conditions printed on the certificate, previews it, and signs with their password. */
export function ReleasePanel({ detail, onReleased }: { detail: QaRunDetail; onReleased: (result: ReleaseResult) => void }) {
  const release = useReleaseCertificate(detail.run.id)
  const d = detail.releaseDefaults
  const form = useForm<ReleaseInput>({
    resolver: zodResolver(ReleaseInputSchema),
    defaultValues: {
      password: '',
      validityMonths: d.validityMonths,
      minimumUsePressureBarGauge: d.minimumUsePressureBarGauge,
      storageMinC: d.storageMinC,
      storageMaxC: d.storageMaxC,
    },
  })
  const { errors } = form.formState
  const values = form.watch()
  const releasable = detail.comparison.releasable && detail.analysis?.verdict === 'within-tolerance'

  const onSubmit = form.handleSubmit((input) =>
    release.mutate(input, {
      onSuccess: onReleased,
      onError: (err) => {
        form.setValue('password', '')
        if (err instanceof ApiError) for (const [f, message] of Object.entries(err.fieldErrors())) form.setError(f as FieldPath<ReleaseInput>, { message })
      },
    }),
  )

  const num = (name: keyof Omit<ReleaseInput, 'password'>) => form.register(name, { valueAsNumber: true })
  const problem =
    release.error instanceof ApiError && !release.error.body.errors?.length
      ? release.error.body.detail
      : release.error && !(release.error instanceof ApiError)
        ? 'Could not reach the server; nothing was released. Try again.'
        : null

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Release the certificate" className="space-y-3">
      {!releasable && (
        <p className="flex items-start gap-2 text-sm text-blocked-fg">
          <SafetyBadge state="blocked" />
          {detail.analysis ? 'Release is possible only when every component is within specification.' : 'Enter the analysis first.'}
        </p>
      )}
      <fieldset disabled={!releasable || release.isPending} className="space-y-3">
        <div className="grid gap-3 sm:grid-cols-2">
          <Field label="Valid for (months from today)" error={errors.validityMonths?.message}>
            {(id, dsc) => <Input id={id} aria-describedby={dsc} type="number" inputMode="numeric" className="num" {...num('validityMonths')} />}
          </Field>
          <Field label="Do not use below (bar gauge)" error={errors.minimumUsePressureBarGauge?.message}>
            {(id, dsc) => (
              <Input id={id} aria-describedby={dsc} type="number" step="any" inputMode="decimal" className="num" {...num('minimumUsePressureBarGauge')} />
            )}
          </Field>
          <Field label="Store and use from (°C)" error={errors.storageMinC?.message} hint={d.storageMinSource}>
            {(id, dsc) => <Input id={id} aria-describedby={dsc} type="number" step="any" inputMode="decimal" className="num" {...num('storageMinC')} />}
          </Field>
          <Field label="Store and use up to (°C)" error={errors.storageMaxC?.message}>
            {(id, dsc) => <Input id={id} aria-describedby={dsc} type="number" step="any" inputMode="decimal" className="num" {...num('storageMaxC')} />}
          </Field>
        </div>
        <a
          className="inline-block text-sm font-semibold text-copper-700 underline"
          href={previewHref(detail.run.id, {
            validityMonths: values.validityMonths,
            minimumUsePressureBarGauge: values.minimumUsePressureBarGauge,
            storageMinC: values.storageMinC,
            storageMaxC: values.storageMaxC,
          })}
          target="_blank"
          rel="noreferrer"
        >
          Preview the certificate (draft PDF, opens in a new tab)
        </a>
        <Field label="Your password (signature)" error={errors.password?.message} hint="Re-enter your sign-in password to sign this certificate.">
          {(id, dsc) => (
            <Input
              id={id}
              aria-describedby={dsc}
              aria-invalid={!!errors.password}
              type="password"
              autoComplete="current-password"
              {...form.register('password')}
            />
          )}
        </Field>
      </fieldset>
      {problem && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {problem}
        </p>
      )}
      <Button type="submit" disabled={!releasable || release.isPending}>
        {release.isPending ? 'Signing…' : 'Sign and release certificate'}
      </Button>
    </form>
  )
}

/** What the release did: the certificate, whether the customer got it by e-mail, and whether the order is certified. */
export function ReleaseNotice({ result, orderNumber }: { result: ReleaseResult; orderNumber: string }) {
  const c = result.certificate
  return (
    <div role="status" className="space-y-1 rounded border border-clear-border bg-clear-bg px-3 py-2 text-sm text-clear-fg">
      <p className="flex flex-wrap items-center gap-2">
        <SafetyBadge state="clear" label="Released" /> Certificate <strong className="num">{c.number}</strong>, revision {c.revision}, signed.{' '}
        <a className="font-semibold underline" href={certificatePdfHref(c.id)}>
          Download the PDF
        </a>
      </p>
      <p>{result.emailed ? 'The PDF was e-mailed to the customer’s contact.' : 'The e-mail could not be sent: send the PDF to the customer by hand.'}</p>
      {result.orderReleased && <p>Every cylinder of order {orderNumber} is now certified: the order moved to “Certified”.</p>}
    </div>
  )
}
