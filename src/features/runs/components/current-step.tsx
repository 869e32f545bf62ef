import { useRef, useState } from 'react'
import { pressureAtTemperature, type RecordReadingResult, type RunDetail, type RunStep } from '#shared/schemas/run.ts'
import { Formula } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { useRecordReading } from '../api/record-reading.ts'
import { formatPressure, formatTemperature, parseTyped, temperatureSymbol, temperatureUnit, typedCelsius } from '../lib/display.ts'
import { StepCautions } from './step-cautions.tsx'

function newRequestId(): string {
  return typeof crypto !== 'undefined' && 'randomUUID' in crypto ? crypto.randomUUID() : `r-${Date.now()}-${Math.random().toString(36).slice(2, 12)}`
}

/**
 * The target of a step at a temperature: the planned pressure at the fill temperature moved along the step's
 * constant-density line (the plan's temperature table), the window with it.
 */
function targetAt(run: RunDetail, step: RunStep, temperatureC: number | null) {
  const atm = run.atmosphericPressure.value
  const planned = step.cumulativePressure.value
  if (step.kind !== 'add' || temperatureC === null) {
    const ratio = step.kind !== 'add' && temperatureC !== null ? (temperatureC + 273.15) / (run.fillTemperature.value + 273.15) : 1
    return {
      gauge: planned * ratio - atm,
      low: step.toleranceWindow.gaugePressureLow ? (step.toleranceWindow.gaugePressureLow.value + atm) * ratio - atm : null,
      high: (step.toleranceWindow.gaugePressureHigh.value + atm) * ratio - atm,
      abs: planned * ratio,
      extrapolated: false,
    }
  }
  const at = pressureAtTemperature(step.temperatureTable, temperatureC)
  const ratio = at ? at.pressureBarAbs / planned : 1
  return {
    gauge: planned * ratio - atm,
    low: step.toleranceWindow.gaugePressureLow ? (step.toleranceWindow.gaugePressureLow.value + atm) * ratio - atm : null,
    high: (step.toleranceWindow.gaugePressureHigh.value + atm) * ratio - atm,
    abs: planned * ratio,
    extrapolated: at?.extrapolated ?? false,
  }
}

const outcomeText = (result: RecordReadingResult, step: RunStep): string => {
  const o = result.reading.outcome
  if (step.kind !== 'add')
    return o === 'on-target'
      ? 'Vented far enough. The next targets are recomputed from your reading.'
      : 'Still above the limit: vent further, let it settle and record again.'
  if (o === 'on-target') return result.run.allStepsDone ? 'every step is recorded.' : `step ${step.index + 1} is done.`
  if (o === 'under') return 'add more gas slowly, let it settle and record again.'
  return 'the fill is re-planned. Confirm the new plan before adding more gas.'
}

/** One step at a time: the gas, the target huge, the cautions, and the reading form. */
export function CurrentStep({
  run,
  step,
  temperatureText,
  setTemperatureText,
  onRecorded,
}: {
  run: RunDetail
  step: RunStep
  /** the measured temperature as typed; kept by the page so it carries over to the next step */
  temperatureText: string
  setTemperatureText: (text: string) => void
  onRecorded: (message: { text: string; outcome: 'on-target' | 'under' | 'over' }) => void
}) {
  const { units } = useDisplayUnits()
  const [pressureText, setPressureText] = useState('')
  const [scaleText, setScaleText] = useState('')
  const [reference, setReference] = useState<'gauge' | 'absolute'>(step.kind === 'evacuate' ? 'absolute' : 'gauge')
  const requestId = useRef<string | null>(null)
  const record = useRecordReading(run.id)
  const res = run.gaugeResolution?.value ?? null

  const temperatureC = typedCelsius(units, temperatureText)
  const temperatureOk = temperatureC !== null && temperatureC >= -50 && temperatureC <= 100
  const target = targetAt(run, step, temperatureOk ? temperatureC : null)
  const pressure = parseTyped(pressureText)
  const scale = parseTyped(scaleText)
  const gravimetric = run.method === 'gravimetric' && step.kind === 'add' && step.toleranceWindow.cumulativeMassLow !== null
  const canSubmit = temperatureOk && pressure !== null && (!gravimetric || scale !== null) && !record.isPending && run.canRecord
  const unit = units.pressure
  const evacuate = step.kind === 'evacuate'

  const submit = () => {
    if (!canSubmit || pressure === null || temperatureC === null) return
    // one id per reading, kept until the server has answered, so a retry after a dropped connection is not recorded twice
    requestId.current ??= newRequestId()
    record.mutate(
      {
        stepIndex: step.index,
        pressure: { value: pressure, unit, reference },
        temperature: { value: parseTyped(temperatureText) ?? 0, unit: temperatureUnit(units) },
        ...(gravimetric && scale !== null ? { scaleMass: { value: scale, unit: 'kg' as const } } : {}),
        clientRequestId: requestId.current,
        expectedVersion: run.version,
      },
      {
        onSuccess: (result) => {
          requestId.current = null
          setPressureText('')
          setScaleText('')
          onRecorded({ text: outcomeText(result, step), outcome: result.reading.outcome })
        },
        onError: (err) => {
          // a definite answer (not a lost connection): the next try is a new reading
          if (err instanceof ApiError) requestId.current = null
        },
      },
    )
  }
  const error =
    record.error instanceof ApiError
      ? record.error.status === 409
        ? `${record.error.body.detail} Check the step and the target, then record again.`
        : record.error.body.detail
      : record.error
        ? 'Not saved: the server could not be reached. Your numbers are still here — press Record again when the connection is back.'
        : null

  return (
    <div className="space-y-5">
      <section aria-labelledby="step-title" className="rounded-card border-2 border-ink-900 bg-white p-4 sm:p-6">
        <h2 id="step-title" className="flex flex-wrap items-center gap-3 text-xl font-semibold text-ink-900 sm:text-2xl">
          {step.kind === 'add' ? (
            <>
              <span className="inline-flex items-center rounded-full border-2 border-ink-900 bg-ink-50 px-4 py-1 text-3xl font-bold sm:text-4xl">
                {step.formula ? <Formula formula={step.formula} /> : 'Premix'}
              </span>
              <span>{step.label}</span>
            </>
          ) : (
            <span className="inline-flex items-center rounded-full border-2 border-ink-900 bg-caution-bg px-4 py-1 text-3xl font-bold">{step.label}</span>
          )}
        </h2>
        {step.note && <p className="mt-2 text-base font-medium text-copper-800">{step.note}</p>}
        <p className="mt-4 text-lg text-ink-700">{step.kind === 'add' ? 'Fill to' : evacuate ? 'Evacuate to at most' : 'Vent down to at most'}</p>
        <p className="num font-bold leading-none tracking-tight text-ink-950" aria-live="polite">
          <span className="text-7xl sm:text-8xl lg:text-9xl">
            {evacuate ? formatPressure(units, target.abs, null) : formatPressure(units, target.gauge, res)}
          </span>{' '}
          <span className="text-3xl sm:text-4xl">
            {unit}{' '}
            {evacuate ? (
              <abbr title="absolute" className="no-underline">
                abs
              </abbr>
            ) : (
              <abbr title="gauge" className="no-underline">
                g
              </abbr>
            )}
          </span>
        </p>
        <p className="mt-3 text-lg text-ink-800">
          {temperatureOk
            ? `at ${formatTemperature(units, temperatureC as number)} ${temperatureSymbol(units)} in the cylinder`
            : 'at the planned fill temperature'}
          {' · '}planned {formatPressure(units, step.cumulativeGaugePressure.value, res)} {unit} g at {formatTemperature(units, run.fillTemperature.value)}{' '}
          {temperatureSymbol(units)}
        </p>
        {step.kind === 'add' && (
          <p className="num mt-1 text-lg text-ink-800">
            Window: {target.low === null ? '—' : formatPressure(units, target.low, res)} to {formatPressure(units, target.high, res)} {unit} g
          </p>
        )}
        {gravimetric && step.cumulativeMass && (
          <p className="num mt-1 text-lg text-ink-800">
            Scale: {step.cumulativeMass.value.toFixed(3)} kg since the start of the fill (window {step.toleranceWindow.cumulativeMassLow?.value.toFixed(3)} to{' '}
            {step.toleranceWindow.cumulativeMassHigh?.value.toFixed(3)} kg)
          </p>
        )}
        {target.extrapolated && (
          <p className="mt-2">
            <SafetyBadge state="caution" label="Outside the plan's temperature table: let the cylinder settle before the final reading" />
          </p>
        )}
      </section>

      <StepCautions cautions={step.cautions} />

      <form
        className="space-y-4 rounded-card border border-ink-300 bg-white p-4 sm:p-6"
        aria-label="Record a reading"
        onSubmit={(e) => {
          e.preventDefault()
          submit()
        }}
      >
        <div className="grid grid-cols-[minmax(0,1fr)] gap-4 sm:grid-cols-2">
          <label className="flex flex-col gap-1 text-lg font-semibold text-ink-900">
            Cylinder temperature ({temperatureSymbol(units)})
            <input
              inputMode="decimal"
              autoComplete="off"
              value={temperatureText}
              onChange={(e) => setTemperatureText(e.target.value)}
              aria-invalid={!temperatureOk}
              className="num min-h-16 w-full min-w-0 rounded-md border-2 border-ink-400 bg-white px-4 text-4xl text-ink-950 focus:border-copper-600 aria-[invalid=true]:border-blocked-solid"
            />
            {!temperatureOk && <span className="text-base font-medium text-blocked-fg">Type the temperature you measured on the cylinder.</span>}
          </label>
          <div className="flex flex-col gap-1">
            <label htmlFor="reading-pressure" className="text-lg font-semibold text-ink-900">
              {reference === 'gauge' ? 'Gauge reading' : 'Absolute reading'} ({unit} {reference === 'gauge' ? 'g' : 'abs'})
            </label>
            <input
              id="reading-pressure"
              inputMode="decimal"
              autoComplete="off"
              value={pressureText}
              onChange={(e) => setPressureText(e.target.value)}
              className="num min-h-20 rounded-md border-2 border-ink-900 bg-white px-4 text-5xl font-bold text-ink-950 focus:border-copper-600"
            />
            <fieldset className="mt-1 grid grid-cols-2 gap-2">
              <legend className="sr-only">The gauge reads</legend>
              {(['gauge', 'absolute'] as const).map((r) => (
                <label
                  key={r}
                  className={cn(
                    'flex min-h-12 cursor-pointer items-center justify-center rounded-md border-2 text-base font-semibold has-[:focus-visible]:outline has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-copper-400',
                    reference === r ? 'border-ink-900 bg-ink-900 text-white' : 'border-ink-300 bg-white text-ink-800',
                  )}
                >
                  <input type="radio" name="reading-reference" value={r} checked={reference === r} onChange={() => setReference(r)} className="sr-only" />
                  {r === 'gauge' ? 'gauge (g)' : 'absolute (abs)'}
                </label>
              ))}
            </fieldset>
          </div>
          {gravimetric && (
            <label className="flex flex-col gap-1 text-lg font-semibold text-ink-900 sm:col-span-2">
              Scale reading since the start of the fill (kg)
              <input
                inputMode="decimal"
                autoComplete="off"
                value={scaleText}
                onChange={(e) => setScaleText(e.target.value)}
                className="num min-h-16 w-full min-w-0 rounded-md border-2 border-ink-400 bg-white px-4 text-4xl text-ink-950 focus:border-copper-600"
              />
            </label>
          )}
        </div>
        <button
          type="submit"
          disabled={!canSubmit}
          className="min-h-16 w-full rounded-md bg-copper-600 px-6 text-2xl font-bold text-white hover:bg-copper-700 disabled:bg-ink-400"
        >
          {record.isPending ? 'Saving…' : 'Record reading'}
        </button>
        {!run.canRecord && <p className="text-base text-ink-700">This fill is assigned to someone else; you can look but not record.</p>}
        {error && (
          <p role="alert" className="rounded-md border-2 border-blocked-border bg-blocked-bg px-4 py-3 text-lg font-semibold text-blocked-fg">
            {error}
          </p>
        )}
      </form>
    </div>
  )
}
