import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { type QaRunDetail, type RejectInput, RejectInputSchema } from '#shared/schemas/quality.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, inputClass } from '#src/components/ui/field.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { useRejectAnalysis } from '../api/reject-analysis.ts'

/** Sends the cylinder back for rework: the reason goes on the cylinder's record and it is held in quarantine. */
export function RejectPanel({ detail, disabled }: { detail: QaRunDetail; disabled: boolean }) {
  const reject = useRejectAnalysis(detail.run.id)
  const form = useForm<RejectInput>({ resolver: zodResolver(RejectInputSchema), defaultValues: { reason: '' } })
  const { errors } = form.formState
  const onSubmit = form.handleSubmit((input) =>
    reject.mutate(input, {
      onError: (err) => {
        if (err instanceof ApiError && err.fieldErrors().reason) form.setError('reason', { message: err.fieldErrors().reason })
      },
    }),
  )
  const problem =
    reject.error instanceof ApiError && !reject.error.body.errors?.length
      ? reject.error.body.detail
      : reject.error && !(reject.error instanceof ApiError)
        ? 'Could not reach the server; nothing changed. Try again.'
        : null
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Send back for rework" className="space-y-3">
      <Field label="Why it goes back" error={errors.reason?.message} hint="The blender sees this on the cylinder, e.g. “CO low by 8 %: top up and re-analyse”.">
        {(id, d) => (
          <textarea
            id={id}
            rows={3}
            aria-describedby={d}
            aria-invalid={!!errors.reason}
            disabled={disabled}
            className={cn(inputClass, 'py-2')}
            {...form.register('reason')}
          />
        )}
      </Field>
      {problem && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {problem}
        </p>
      )}
      <Button type="submit" variant="danger" disabled={disabled || reject.isPending}>
        {reject.isPending ? 'Sending back…' : 'Send back for rework'}
      </Button>
    </form>
  )
}
