import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom'
import { READING_OUTCOME_LABEL, RUN_STATUS_LABEL, type RunDetail } from '#shared/schemas/run.ts'
import { paths } from '#src/app/paths.ts'
import { Formula } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { useCompleteRun } from '../api/complete-run.ts'
import { usePauseRun } from '../api/pause-run.ts'
import { useResumeRun } from '../api/resume-run.ts'
import { runQueries } from '../api/run-queries.ts'
import { CurrentStep } from '../components/current-step.tsx'
import { ReplanDialog } from '../components/replan-dialog.tsx'
import { formatPressure, formatTemperature } from '../lib/display.ts'

export async function loader({ params }: LoaderFunctionArgs) {
  const id = Number(params.id)
  if (Number.isInteger(id) && id > 0) await queryClient.ensureQueryData(runQueries.detail(id)).catch(() => null)
  return null
}

const bigButton = 'min-h-14 rounded-md px-6 text-lg font-semibold disabled:bg-ink-400'

function Progress({ run }: { run: RunDetail }) {
  const done = run.status === 'completed' ? run.stepCount : Math.min(run.currentStep, run.stepCount)
  return (
    <div>
      <div className="mb-1 flex justify-between text-base font-semibold text-ink-800">
        <span>{run.allStepsDone || run.status === 'completed' ? 'All steps recorded' : `Step ${done + 1} of ${run.stepCount}`}</span>
        <span className="num">
          {done}/{run.stepCount} done
        </span>
      </div>
      <div
        role="progressbar"
        aria-label="Steps done"
        aria-valuemin={0}
        aria-valuemax={run.stepCount}
        aria-valuenow={done}
        className="h-4 w-full overflow-hidden rounded-full bg-ink-200"
      >
        <div className="h-full bg-copper-600 transition-all" style={{ width: `${run.stepCount ? (100 * done) / run.stepCount : 0}%` }} />
      </div>
    </div>
  )
}

function StepList({ run }: { run: RunDetail }) {
  const { units } = useDisplayUnits()
  return (
    <ol className="space-y-1 text-base" aria-label="All steps">
      {run.steps.map((s) => (
        <li
          key={s.index}
          className={cn(
            'flex flex-wrap items-center gap-x-3 rounded px-2 py-1',
            s.state === 'current' && 'bg-copper-50 font-semibold',
            s.state === 'done' && 'text-ink-600',
          )}
        >
          <span className="num w-6">{s.index + 1}.</span>
          <span>{s.kind === 'add' ? s.formula ? <Formula formula={s.formula} /> : s.label : s.label}</span>
          <span className="num">
            →{' '}
            {s.kind === 'evacuate'
              ? `${formatPressure(units, s.cumulativePressure.value)} ${units.pressure} abs`
              : `${formatPressure(units, s.cumulativeGaugePressure.value, run.gaugeResolution?.value ?? null)} ${units.pressure} g`}
          </span>
          <span className="text-sm">{s.state === 'done' ? '✓ done' : s.state === 'current' ? '← now' : ''}</span>
        </li>
      ))}
    </ol>
  )
}

function Readings({ run }: { run: RunDetail }) {
  const { units } = useDisplayUnits()
  if (run.readings.length === 0) return <p className="text-base text-ink-600">No readings yet. Each reading is saved the moment you record it.</p>
  return (
    <ul className="space-y-1 text-base">
      {[...run.readings].reverse().map((r) => (
        <li key={r.id} className="num flex flex-wrap gap-x-3">
          <span>Step {r.stepIndex + 1}</span>
          <span>{r.pressureBarGauge === null ? '—' : `${formatPressure(units, r.pressureBarGauge)} ${units.pressure} g`}</span>
          <span>{r.temperatureC === null ? '' : `${formatTemperature(units, r.temperatureC)} ${units.temperature === 'degF' ? '°F' : '°C'}`}</span>
          <span className="font-semibold">{READING_OUTCOME_LABEL[r.outcome]}</span>
          <span className="text-ink-600">
            {r.recordedBy}, {new Date(r.recordedAt).toLocaleTimeString()}
          </span>
        </li>
      ))}
    </ul>
  )
}

function RunScreen({ run }: { run: RunDetail }) {
  const { units } = useDisplayUnits()
  const [temperatureText, setTemperatureText] = useState(() => formatTemperature(units, run.fillTemperature.value))
  const [flash, setFlash] = useState<{ text: string; outcome: 'on-target' | 'under' | 'over' } | null>(null)
  const pause = usePauseRun(run.id)
  const resume = useResumeRun(run.id)
  const complete = useCompleteRun(run.id)
  const step = run.steps[run.currentStep]
  const actionError = [pause.error, resume.error, complete.error].find(Boolean)
  const actionMessage =
    actionError instanceof ApiError ? actionError.body.detail : actionError ? 'Could not reach the server; nothing was changed. Try again.' : null
  const open = run.status !== 'completed' && run.status !== 'aborted'

  return (
    <div className="mx-auto max-w-4xl space-y-5 text-ink-950">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <p className="text-base text-ink-700">
            <Link to={paths.runs.mine.href()} className="font-semibold text-copper-800 underline">
              My fills
            </Link>{' '}
            · {run.order?.number ?? ''} · {run.description ?? ''}
          </p>
          <h1 className="font-mono text-3xl font-bold">{run.cylinder.serial}</h1>
          <p className="text-base text-ink-700">
            {run.cylinder.waterVolumeL} L · marked {run.cylinder.servicePressureBar} bar (gauge) · {run.cylinder.valveOutlet}
            {run.cylinder.oxygenClean ? ' · oxygen-clean' : ''} · {RUN_STATUS_LABEL[run.status]}
          </p>
        </div>
        {open && run.canRecord && (
          <div className="flex gap-2">
            {run.status === 'paused' ? (
              <button
                type="button"
                className={cn(bigButton, 'bg-ink-900 text-white')}
                disabled={resume.isPending}
                onClick={() => resume.mutate({ expectedVersion: run.version })}
              >
                Resume
              </button>
            ) : (
              <button
                type="button"
                className={cn(bigButton, 'border-2 border-ink-900 bg-white text-ink-900')}
                disabled={pause.isPending}
                onClick={() => pause.mutate({ expectedVersion: run.version })}
              >
                Pause
              </button>
            )}
          </div>
        )}
      </header>

      <Progress run={run} />

      {run.notes && (
        <div className="space-y-2">
          {run.notes.split('\n').map((n) => (
            <p key={n} className="rounded-md border-2 border-caution-border bg-caution-bg px-4 py-2 text-base font-medium text-caution-fg">
              {n}
            </p>
          ))}
        </div>
      )}
      {actionMessage && (
        <p role="alert" className="rounded-md border-2 border-blocked-border bg-blocked-bg px-4 py-3 text-lg font-semibold text-blocked-fg">
          {actionMessage}
        </p>
      )}
      {flash && (
        <p
          role="status"
          className={cn(
            'rounded-md border-2 px-4 py-3 text-lg font-semibold',
            flash.outcome === 'on-target' ? 'border-clear-border bg-clear-bg text-clear-fg' : 'border-caution-border bg-caution-bg text-caution-fg',
          )}
        >
          {READING_OUTCOME_LABEL[flash.outcome]}: {flash.text}
        </p>
      )}

      {run.status === 'completed' ? (
        <section className="rounded-card border-2 border-clear-border bg-clear-bg p-6 text-clear-fg">
          <SafetyBadge state="clear" label="Finished" className="text-base" />
          <p className="mt-2 text-xl font-semibold">
            Fill finished{run.completedAt ? ` at ${new Date(run.completedAt).toLocaleTimeString()}` : ''}. The cylinder waits for analysis.
          </p>
          <Link to={paths.runs.mine.href()} className={cn(bigButton, 'mt-4 inline-flex items-center bg-ink-900 text-white')}>
            Back to my fills
          </Link>
        </section>
      ) : run.status === 'paused' ? (
        <section className="rounded-card border-2 border-ink-400 bg-ink-50 p-6">
          <p className="text-2xl font-bold">Paused</p>
          <p className="mt-1 text-lg text-ink-800">
            {run.pendingReplan ? 'A re-plan waits for your confirmation after you resume. ' : ''}Nothing is lost: every reading is saved. Resume when you are
            back at the manifold.
          </p>
        </section>
      ) : run.pendingReplan ? (
        run.canRecord ? (
          <ReplanDialog run={run} />
        ) : (
          <p className="text-lg">A re-plan waits for the technician's confirmation.</p>
        )
      ) : run.allStepsDone || !step ? (
        <section className="space-y-4 rounded-card border-2 border-ink-900 bg-white p-6">
          <p className="text-2xl font-bold">Every step is recorded</p>
          <p className="rounded-md border-2 border-caution-border bg-caution-bg px-4 py-3 text-lg text-caution-fg">
            Caution — high pressure: close the cylinder valve, vent the filling line slowly, and fit the outlet cap and valve guard before you disconnect or
            move the cylinder. Follow local codes and licensed practice.
          </p>
          {run.canRecord && (
            <button
              type="button"
              className={cn(bigButton, 'min-h-16 w-full bg-copper-600 text-2xl text-white hover:bg-copper-700')}
              disabled={complete.isPending}
              onClick={() => complete.mutate({ expectedVersion: run.version }, { onSuccess: () => setFlash(null) })}
            >
              {complete.isPending ? 'Saving…' : 'Finish fill — send to analysis'}
            </button>
          )}
        </section>
      ) : (
        <CurrentStep
          key={`${step.index}-${step.segment}`}
          run={run}
          step={step}
          temperatureText={temperatureText}
          setTemperatureText={setTemperatureText}
          onRecorded={setFlash}
        />
      )}

      <details className="rounded-card border border-ink-200 bg-white p-4" open>
        <summary className="min-h-12 cursor-pointer content-center text-lg font-semibold">All steps</summary>
        <StepList run={run} />
      </details>
      <details className="rounded-card border border-ink-200 bg-white p-4">
        <summary className="min-h-12 cursor-pointer content-center text-lg font-semibold">Readings ({run.readings.length})</summary>
        <Readings run={run} />
      </details>
    </div>
  )
}

export function Component() {
  const id = Number(useParams().id)
  const run = useQuery(runQueries.detail(id))
  const { units } = useDisplayUnits()
  if (run.isPending) return <SkeletonRows rows={6} />
  if (run.isError) return <ErrorState error={run.error} retry={() => void run.refetch()} />
  // a new temperature unit starts the typed temperature afresh in that unit
  return <RunScreen key={`${id}-${units.temperature}`} run={run.data} />
}
