import { useEffect, useRef } from 'react'
import { REPLAN_OPTION_ACTION, type RunDetail } from '#shared/schemas/run.ts'
import { Formula } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useConfirmReplan } from '../api/confirm-replan.ts'
import { usePauseRun } from '../api/pause-run.ts'
import { formatPressure } from '../lib/display.ts'

const pct = (x: number) => (x >= 0.01 ? `${(x * 100).toFixed(2)} %` : `${(x * 1e6).toFixed(0)} ppm`)

/**
 * After a reading above the window the planner recomputes what is in the cylinder and what can still be done.
 * Nothing more is recorded until the technician picks one option here.
 */
export function ReplanDialog({ run }: { run: RunDetail }) {
  const pending = run.pendingReplan
  const { units } = useDisplayUnits()
  const confirm = useConfirmReplan(run.id)
  const pause = usePauseRun(run.id)
  const heading = useRef<HTMLHeadingElement>(null)
  useEffect(() => heading.current?.focus(), [])
  if (!pending) return null
  const failed = pending.status === 'failed'
  const error =
    confirm.error instanceof ApiError ? confirm.error.body.detail : confirm.error ? 'Could not reach the server; nothing was changed. Try again.' : null
  return (
    <div className="fixed inset-0 z-40 overflow-y-auto bg-ink-950/70 p-3 sm:p-6">
      <div role="dialog" aria-modal="true" aria-labelledby="replan-title" className="mx-auto max-w-3xl space-y-4 rounded-card bg-white p-5 shadow-2xl">
        <div className="flex flex-wrap items-center gap-3">
          <SafetyBadge
            state={failed || pending.status === 'cannot-meet' ? 'blocked' : 'caution'}
            label={failed ? 'Stop' : pending.status === 'cannot-meet' ? 'Spec not reachable' : 'New targets'}
            className="text-base"
          />
          <h2 id="replan-title" ref={heading} tabIndex={-1} className="text-2xl font-bold text-ink-950">
            Reading above the window on step {pending.stepIndex + 1}
          </h2>
        </div>
        <p className="text-lg text-ink-900">{pending.verdict}</p>
        <p className="text-base text-ink-700">
          One gas cannot be taken back out: venting removes every component in proportion. Confirm one option before adding more gas.
        </p>
        {pending.composition.length > 0 && (
          <table className="w-full text-base">
            <caption className="mb-1 text-left font-semibold text-ink-900">
              In the cylinder now
              {pending.gaugePressureAtFillTemperature && (
                <span className="num font-normal">
                  {' '}
                  (≈ {formatPressure(units, pending.gaugePressureAtFillTemperature.value, run.gaugeResolution?.value ?? null)} {units.pressure} g at{' '}
                  {run.fillTemperature.value} °C)
                </span>
              )}
            </caption>
            <thead>
              <tr className="text-left text-sm uppercase text-ink-600">
                <th className="py-1">Gas</th>
                <th className="py-1 text-right">Now</th>
                <th className="py-1 text-right">Ordered</th>
              </tr>
            </thead>
            <tbody>
              {pending.composition.map((c) => (
                <tr key={c.gas} className="border-t border-ink-100">
                  <td className="py-1">{c.formula ? <Formula formula={c.formula} /> : c.gas}</td>
                  <td className="num py-1 text-right">{pct(c.fraction)}</td>
                  <td className="num py-1 text-right">{c.target === null ? '—' : pct(c.target)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {pending.warnings.map((w) => (
          <p key={w.code + w.message} className="rounded border border-caution-border bg-caution-bg px-3 py-2 text-base text-caution-fg">
            {w.message}
          </p>
        ))}
        <div className="space-y-3">
          {pending.options.map((o) => (
            <section key={o.kind} className="rounded-card border-2 border-ink-300 p-4">
              <p className="text-base text-ink-900">{o.description}</p>
              {(o.kind === 'vent' || o.kind === 'remake') && (
                <p className="mt-2 rounded border border-caution-border bg-caution-bg px-3 py-2 text-base text-caution-fg">
                  Caution — venting: vent slowly through the vent line to a safe place outside, never into the room. Follow local codes and licensed practice.
                </p>
              )}
              {o.steps.length > 0 && (
                <ol className="mt-2 flex flex-wrap gap-2 text-base">
                  {o.ventToGaugePressure &&
                    (o.kind === 'remake' ? (
                      <li className="num rounded bg-ink-100 px-2 py-1">
                        evacuate to ≤ {formatPressure(units, o.ventToGaugePressure.value + run.atmosphericPressure.value)} {units.pressure} abs
                      </li>
                    ) : (
                      <li className="num rounded bg-ink-100 px-2 py-1">
                        vent to ≤ {formatPressure(units, o.ventToGaugePressure.value, run.gaugeResolution?.value ?? null)} {units.pressure} g
                      </li>
                    ))}
                  {o.steps.map((s, i) => (
                    <li key={i} className="num rounded bg-ink-100 px-2 py-1">
                      {s.formula ? <Formula formula={s.formula} /> : s.label} →{' '}
                      {formatPressure(units, s.cumulativeGaugePressure.value, run.gaugeResolution?.value ?? null)} {units.pressure} g
                    </li>
                  ))}
                </ol>
              )}
              <button
                type="button"
                disabled={confirm.isPending}
                onClick={() => confirm.mutate({ expectedVersion: run.version, option: o.kind })}
                className="mt-3 min-h-14 w-full rounded-md bg-copper-600 px-5 text-lg font-semibold text-white hover:bg-copper-700 disabled:bg-ink-400"
              >
                {REPLAN_OPTION_ACTION[o.kind]}
              </button>
            </section>
          ))}
          {pending.options.length === 0 && (
            <p className="text-lg font-semibold text-blocked-fg">No option can be computed here. Close the valves and ask the blender.</p>
          )}
        </div>
        {error && (
          <p role="alert" className="text-base font-medium text-blocked-fg">
            {error}
          </p>
        )}
        {run.status !== 'paused' && (
          <button
            type="button"
            onClick={() => pause.mutate({ expectedVersion: run.version, note: 'Waiting for the blender after an overshoot' })}
            disabled={pause.isPending}
            className="min-h-12 w-full rounded-md border-2 border-ink-400 bg-white px-5 text-base font-semibold text-ink-900"
          >
            Pause and ask the blender
          </button>
        )}
      </div>
    </div>
  )
}
