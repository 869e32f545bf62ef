import { zodResolver } from '@hookform/resolvers/zod'
import { type FieldPath, useForm } from 'react-hook-form'
import type { z } from 'zod'
import { AnalysisInputSchema, fromMoleFraction, naturalUnit, type QaRunDetail } from '#shared/schemas/quality.ts'
import { Button } from '#src/components/ui/button.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useSaveAnalysis } from '../api/save-analysis.ts'
import { ResultRows } from './result-rows.tsx'

type FormIn = z.input<typeof AnalysisInputSchema>
type FormOut = z.output<typeof AnalysisInputSchema>

function defaults(detail: QaRunDetail): FormIn {
  const certified = detail.line.components.filter((c) => !c.balance)
  return {
    results: certified.map((c) => {
      const r = detail.analysis?.results.find((x) => x.gas === c.gas)
      const unit = r?.unit ?? detail.comparison.rows.find((x) => x.gas === c.gas)?.unit ?? naturalUnit(c.fraction)
      return r
        ? {
            gas: c.gas,
            value: fromMoleFraction(r.value, unit),
            unit,
            expandedUncertainty: fromMoleFraction(r.expandedUncertainty, unit),
            coverageFactor: r.coverageFactor,
            instrument: r.instrument,
            method: r.method,
          }
        : { gas: c.gas, value: Number.NaN, unit, expandedUncertainty: Number.NaN, coverageFactor: 2, instrument: '', method: '' }
    }),
  }
}

/** QA's analysis entry: one block per certified component; the comparison is recomputed by the server on save. */
export function AnalysisForm({ detail, disabled }: { detail: QaRunDetail; disabled: boolean }) {
  const save = useSaveAnalysis(detail.run.id)
  const form = useForm<FormIn, unknown, FormOut>({ resolver: zodResolver(AnalysisInputSchema), defaultValues: defaults(detail) })
  const gases = detail.line.components.filter((c) => !c.balance)
  const errorOf = (path: string) => (form.getFieldState(path as FieldPath<FormIn>, form.formState).error?.message as string | undefined) ?? undefined

  const onSubmit = form.handleSubmit((input) =>
    save.mutate(input, {
      onSuccess: (next) => form.reset(defaults(next)),
      onError: (err) => {
        if (err instanceof ApiError) for (const [f, message] of Object.entries(err.fieldErrors())) form.setError(f as FieldPath<FormIn>, { message })
      },
    }),
  )
  const copyFirst = () => {
    const [first] = form.getValues('results')
    gases.forEach((_, i) => {
      if (i === 0) return
      form.setValue(`results.${i}.instrument`, first.instrument, { shouldDirty: true })
      form.setValue(`results.${i}.method`, first.method, { shouldDirty: true })
    })
  }
  const problem = save.error instanceof ApiError ? save.error.body.detail : save.error ? 'Could not reach the server; nothing was saved. Try again.' : null

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Analysis results" className="space-y-4">
      <fieldset disabled={disabled || save.isPending} className="space-y-4">
        <ResultRows gases={gases} field={(p, o) => form.register(p as FieldPath<FormIn>, o)} errorOf={errorOf} />
      </fieldset>
      {problem && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {problem}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={disabled || save.isPending}>
          {save.isPending ? 'Comparing…' : 'Save and compare'}
        </Button>
        {gases.length > 1 && (
          <Button variant="secondary" onClick={copyFirst} disabled={disabled}>
            Same instrument and method for every component
          </Button>
        )}
      </div>
    </form>
  )
}
