import { lazy, Suspense, useDeferredValue, useMemo, useState } from 'react'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import { getGas, REFERENCE_CONDITIONS, type ReferenceConditionId } from '#shared/physics/index.ts'
import { MODEL_LABEL } from '#shared/schemas/gas.ts'
import { standingCautions } from '#shared/schemas/plan-cautions.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { MixtureEditor, type MixtureRowDraft, parseMixture } from '#src/components/gas/mixture-editor.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { SafetyBadge, severityToState } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, PageHeader, Skeleton } from '#src/components/ui/states.tsx'
import { cn } from '#src/lib/cn.ts'
import {
  fmt,
  kelvinToUnit,
  PRESSURE_DECIMALS,
  type PressureDisplayUnit,
  paToUnit,
  sig,
  signedPct,
  TEMPERATURE_SYMBOL,
  type TemperatureDisplayUnit,
  unitToKelvin,
  unitToPa,
} from '#src/lib/format.ts'
import { computeCalculator, type ModelResult, zCurve } from '../lib/compute.ts'

const ZChart = lazy(() => import('../components/z-chart.tsx'))

/** The reference conditions offered for standard volumes (0/15/20 °C at 101.325 kPa; 70 °F at 14.696 psia). */
const REFERENCE_CHOICES: ReferenceConditionId[] = ['0C-101325', '15C-101325', '20C-101325', '70F-14.696psia']

function num(text: string): number {
  return text.trim() === '' ? Number.NaN : Number(text.replace(',', '.'))
}

interface Draft {
  rows: MixtureRowDraft[]
  temperature: string
  temperatureUnit: TemperatureDisplayUnit
  pressure: string
  pressureUnit: PressureDisplayUnit
  reference: 'gauge' | 'absolute'
  atmosphere: string
  atmosphereUnit: PressureDisplayUnit
  waterVolumeL: string
  referenceId: ReferenceConditionId
}

function useCalculation(draft: Draft) {
  return useMemo(() => {
    const parsed = parseMixture(draft.rows)
    const errors: Record<string, string> = {}
    const t = num(draft.temperature)
    const p = num(draft.pressure)
    const atm = num(draft.atmosphere)
    const v = num(draft.waterVolumeL)
    if (!Number.isFinite(t)) errors.temperature = 'Enter the gas temperature'
    const temperatureK = unitToKelvin(t, draft.temperatureUnit)
    if (Number.isFinite(t) && !(temperatureK > 0)) errors.temperature = 'Below absolute zero'
    if (!Number.isFinite(atm) || atm <= 0) errors.atmosphere = 'Enter the local atmospheric pressure (absolute, above 0)'
    const atmPa = unitToPa(atm, draft.atmosphereUnit)
    if (!Number.isFinite(p)) errors.pressure = 'Enter the pressure'
    const pressurePa = unitToPa(p, draft.pressureUnit) + (draft.reference === 'gauge' ? atmPa : 0)
    if (Number.isFinite(p) && !(pressurePa > 0)) errors.pressure = 'The absolute pressure must be above 0'
    if (!Number.isFinite(v) || v <= 0) errors.waterVolume = 'Enter the water volume in litres (above 0)'
    const ok = !parsed.error && Object.keys(parsed.rowErrors).length === 0 && Object.keys(errors).length === 0
    if (!ok) return { parsed, errors, result: null, curve: null, temperatureK, pressurePa }
    const mixture = { gasIds: parsed.gasIds, x: parsed.x }
    const result = computeCalculator({ mixture, temperatureK, pressurePa, waterVolumeM3: v / 1000, referenceId: draft.referenceId })
    const curve = zCurve(mixture, temperatureK)
    return { parsed, errors, result, curve, temperatureK, pressurePa }
  }, [draft])
}

function ResultsTable({ models, referenceLabel }: { models: ReturnType<typeof computeCalculator>['models']; referenceLabel: string }) {
  const okRows = models.filter((m): m is ModelResult => m.ok)
  const hasGerg = okRows.some((m) => m.model === 'gerg-2008')
  const rows: { label: string; unit: string; get: (m: ModelResult) => string; gerg?: (m: ModelResult) => string }[] = [
    { label: 'Compressibility factor Z', unit: '', get: (m) => fmt(m.compressibility, 4) },
    { label: 'Z compared with GERG-2008', unit: '', get: (m) => (m.zDeviationFromGerg === null ? '—' : signedPct(m.zDeviationFromGerg * 100)) },
    { label: 'Density', unit: 'kg/m³', get: (m) => sig(m.densityKgPerM3, 5) },
    { label: 'Molar volume', unit: 'L/mol', get: (m) => sig(m.molarVolumeM3PerMol * 1000, 5) },
    { label: 'Contents', unit: 'mol', get: (m) => sig(m.amountMol, 5) },
    {
      label: 'Contents compared with GERG-2008',
      unit: '',
      get: (m) => (m.contentsDeviationFromGerg === null ? '—' : signedPct(m.contentsDeviationFromGerg * 100)),
    },
    { label: 'Mass of gas', unit: 'kg', get: (m) => sig(m.massKg, 4) },
    { label: 'Standard volume', unit: `m³ at ${referenceLabel}`, get: (m) => sig(m.standardVolumeM3, 4) },
    { label: 'Standard volume', unit: 'scf at 70 °F, 14.696 psia', get: (m) => sig(m.standardCubicFeet, 4) },
  ]
  return (
    <ScrollRegion label="Model results table">
      <table className="w-full text-sm">
        <caption className="sr-only">Results of every equation of state at the given state</caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-3">
              Quantity
            </th>
            {models.map((m) => (
              <th key={m.model} scope="col" className={cn('py-2 pr-3 text-right', m.model === 'gerg-2008' && 'text-ink-900')}>
                {MODEL_LABEL[m.model]}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.label + r.unit} className="border-b border-ink-100">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal text-ink-700">
                {r.label}
                {r.unit && <span className="block text-xs text-ink-500">{r.unit}</span>}
              </th>
              {models.map((m) => (
                <td key={m.model} className="num py-1.5 pr-3 text-right">
                  {m.ok ? r.get(m) : <span className="text-xs text-ink-500">not evaluated</span>}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      {!hasGerg && <p className="mt-2 text-xs text-ink-600">No comparison with GERG-2008: it does not cover every gas of this mixture.</p>}
      {models.some((m) => !m.ok) && (
        <ul className="mt-2 space-y-1 text-xs text-ink-700">
          {models
            .filter((m) => !m.ok)
            .map((m) => (
              <li key={m.model}>
                <strong>{MODEL_LABEL[m.model]}:</strong> {!m.ok && m.error}
              </li>
            ))}
        </ul>
      )}
    </ScrollRegion>
  )
}

export function Component() {
  const { units } = useDisplayUnits()
  const [draft, setDraft] = useState<Draft>(() => ({
    rows: [
      { gas: 'argon', amount: '82', unit: 'percent' },
      { gas: 'carbon-dioxide', amount: '18', unit: 'percent' },
    ],
    temperature: units.temperature === 'degF' ? '59' : '15',
    temperatureUnit: units.temperature,
    pressure: units.pressure === 'psi' ? '2900' : units.pressure === 'kPa' ? '20000' : '200',
    pressureUnit: units.pressure,
    reference: 'gauge',
    atmosphere: units.pressure === 'psi' ? '14.696' : units.pressure === 'kPa' ? '101.325' : '1.01325',
    atmosphereUnit: units.pressure,
    waterVolumeL: '50',
    referenceId: '15C-101325',
  }))
  const deferred = useDeferredValue(draft)
  const { parsed, errors, result, curve, temperatureK, pressurePa } = useCalculation(deferred)
  const set = (patch: Partial<Draft>) => setDraft((d) => ({ ...d, ...patch }))
  const reference = REFERENCE_CONDITIONS.find((r) => r.id === draft.referenceId)!
  const pUnit = draft.pressureUnit
  const warnings = result
    ? result.models
        .flatMap((m) => (m.ok ? m.warnings.map((w) => ({ ...w, model: m.model })) : []))
        .filter((w) => w.severity !== 'info' || w.code === 'fallback-model')
    : []
  const cautions = standingCautions(parsed.gasIds.map((gas, i) => ({ gas, fraction: Number.isFinite(parsed.x[i]) ? parsed.x[i] : 0 })))
  const tLabel = Number.isFinite(temperatureK)
    ? `${fmt(kelvinToUnit(temperatureK, draft.temperatureUnit), 1)} ${TEMPERATURE_SYMBOL[draft.temperatureUnit]}`
    : '—'

  return (
    <div>
      <PageHeader
        title="State calculator"
        subtitle="The state of a gas mixture under every equation of state, side by side. Computed in your browser as you type; nothing is saved."
      />
      <div className="grid gap-5 xl:grid-cols-[minmax(0,32rem)_minmax(0,1fr)]">
        <Card title="Mixture and state">
          <div className="space-y-4">
            <MixtureEditor rows={draft.rows} onChange={(rows) => set({ rows })} errors={parsed.rowErrors} sumError={parsed.error} />
            <div className="grid grid-cols-[1fr_auto] items-end gap-2">
              <Field label="Gas temperature" error={errors.temperature}>
                {(id, d) => (
                  <Input
                    id={id}
                    aria-describedby={d}
                    aria-invalid={!!errors.temperature}
                    inputMode="decimal"
                    className="num"
                    value={draft.temperature}
                    onChange={(e) => set({ temperature: e.target.value })}
                  />
                )}
              </Field>
              <Field label="Unit">
                {(id) => (
                  <Select id={id} value={draft.temperatureUnit} onChange={(e) => set({ temperatureUnit: e.target.value as TemperatureDisplayUnit })}>
                    <option value="degC">°C</option>
                    <option value="degF">°F</option>
                  </Select>
                )}
              </Field>
            </div>
            <div className="grid grid-cols-[1fr_auto_auto] items-end gap-2">
              <Field label="Pressure" error={errors.pressure}>
                {(id, d) => (
                  <Input
                    id={id}
                    aria-describedby={d}
                    aria-invalid={!!errors.pressure}
                    inputMode="decimal"
                    className="num"
                    value={draft.pressure}
                    onChange={(e) => set({ pressure: e.target.value })}
                  />
                )}
              </Field>
              <Field label="Unit">
                {(id) => (
                  <Select id={id} value={draft.pressureUnit} onChange={(e) => set({ pressureUnit: e.target.value as PressureDisplayUnit })}>
                    <option value="bar">bar</option>
                    <option value="psi">psi</option>
                    <option value="kPa">kPa</option>
                  </Select>
                )}
              </Field>
              <Field label="Gauge or absolute">
                {(id) => (
                  <Select id={id} value={draft.reference} onChange={(e) => set({ reference: e.target.value as 'gauge' | 'absolute' })}>
                    <option value="gauge">gauge</option>
                    <option value="absolute">absolute</option>
                  </Select>
                )}
              </Field>
            </div>
            <div className="grid grid-cols-[1fr_auto] items-end gap-2">
              <Field
                label="Local atmospheric pressure (absolute)"
                error={errors.atmosphere}
                hint="Added to gauge readings. 1.01325 bar is the standard atmosphere."
              >
                {(id, d) => (
                  <Input
                    id={id}
                    aria-describedby={d}
                    aria-invalid={!!errors.atmosphere}
                    inputMode="decimal"
                    className="num"
                    value={draft.atmosphere}
                    onChange={(e) => set({ atmosphere: e.target.value })}
                  />
                )}
              </Field>
              <Field label="Unit">
                {(id) => (
                  <Select id={id} value={draft.atmosphereUnit} onChange={(e) => set({ atmosphereUnit: e.target.value as PressureDisplayUnit })}>
                    <option value="bar">bar</option>
                    <option value="psi">psi</option>
                    <option value="kPa">kPa</option>
                  </Select>
                )}
              </Field>
            </div>
            <Field label="Cylinder water volume, L" error={errors.waterVolume}>
              {(id, d) => (
                <Input
                  id={id}
                  aria-describedby={d}
                  aria-invalid={!!errors.waterVolume}
                  inputMode="decimal"
                  className="num"
                  value={draft.waterVolumeL}
                  onChange={(e) => set({ waterVolumeL: e.target.value })}
                />
              )}
            </Field>
            <Field label="Reference conditions for standard volumes" hint={reference.source}>
              {(id, d) => (
                <Select id={id} aria-describedby={d} value={draft.referenceId} onChange={(e) => set({ referenceId: e.target.value as ReferenceConditionId })}>
                  {REFERENCE_CHOICES.map((rid) => {
                    const r = REFERENCE_CONDITIONS.find((x) => x.id === rid)!
                    return (
                      <option key={rid} value={rid}>
                        {r.label}
                      </option>
                    )
                  })}
                </Select>
              )}
            </Field>
            {result && (
              <p className="num text-xs text-ink-600">
                Evaluated at {tLabel} and {fmt(paToUnit(pressurePa, pUnit), PRESSURE_DECIMALS[pUnit])} {pUnit} absolute.
              </p>
            )}
          </div>
        </Card>

        <div className="space-y-5">
          <section aria-label="Cautions" className="space-y-2">
            {cautions.map((c) => (
              <div
                key={c.key}
                className="flex flex-wrap items-start gap-2 rounded-card border border-caution-border bg-caution-bg px-3 py-2 text-sm text-caution-fg"
              >
                <SafetyBadge state="caution" label={c.title} />
                <span>{c.text}</span>
              </div>
            ))}
          </section>
          <Card title="Every model at this state">
            {result ? (
              <ResultsTable models={result.models} referenceLabel={reference.label} />
            ) : (
              <EmptyState title="Fix the highlighted fields">
                Results for all five equations of state appear here as soon as the mixture adds up to 100 % and the state is complete.
              </EmptyState>
            )}
            {warnings.length > 0 && (
              <ul className="mt-3 space-y-1.5" aria-label="Findings">
                {warnings.map((w, i) => (
                  <li key={i} className="flex flex-wrap items-start gap-2 text-sm">
                    <SafetyBadge state={severityToState(w.severity)} label={w.severity === 'info' ? 'Note' : undefined} />
                    <span>
                      <strong>{MODEL_LABEL[w.model]}:</strong> {w.message}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Card>

          {result && (
            <Card title="Partial pressures (Dalton) and partial volumes (Amagat)">
              <table className="w-full text-sm">
                <caption className="sr-only">Partial pressure and partial volume of each gas</caption>
                <thead>
                  <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                    <th scope="col" className="py-2 pr-3">
                      Gas
                    </th>
                    <th scope="col" className="py-2 pr-3 text-right">
                      Amount fraction
                    </th>
                    <th scope="col" className="py-2 pr-3 text-right">
                      Partial pressure, {pUnit} absolute
                    </th>
                    <th scope="col" className="py-2 text-right">
                      Partial volume, L at the stated state
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {parsed.gasIds.map((id, i) => {
                    const g = getGas(id)
                    return (
                      <tr key={id} className="border-b border-ink-100">
                        <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                          <GasChip formula={g.formula} name={g.name} showName />
                        </th>
                        <td className="num py-1.5 pr-3 text-right">{fmt(parsed.x[i] * 100, 4)} %</td>
                        <td className="num py-1.5 pr-3 text-right">{fmt(paToUnit(result.partialPressuresPa[i], pUnit), PRESSURE_DECIMALS[pUnit] + 1)}</td>
                        <td className="num py-1.5 text-right">{fmt(result.partialVolumesM3[i] * 1000, 2)}</td>
                      </tr>
                    )
                  })}
                </tbody>
              </table>
              <p className="mt-2 text-xs text-ink-600">
                Dalton: p<sub>i</sub> = x<sub>i</sub>·p. Amagat: V<sub>i</sub> = x<sub>i</sub>·V. Both laws assume ideal-gas behaviour; at cylinder pressure
                they are approximate and fill targets must come from the equation of state of the mixture after each step.
              </p>
              {result.mixingWarnings.map((w) => (
                <p key={w.message} className="mt-2 flex flex-wrap items-start gap-2 text-sm">
                  <SafetyBadge state="caution" label="Real gas" />
                  <span>{w.message}</span>
                </p>
              ))}
            </Card>
          )}

          {curve && (
            <Card title={`Compressibility factor against pressure at ${tLabel}`}>
              <Suspense fallback={<Skeleton className="h-80 w-full" />}>
                <ZChart points={curve} temperatureLabel={tLabel} />
              </Suspense>
            </Card>
          )}
        </div>
      </div>
    </div>
  )
}
