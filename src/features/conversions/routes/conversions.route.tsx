import { useDeferredValue, useMemo, useState } from 'react'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import { getGas, type ModelId, mixtureMolarMassKgPerMol, REFERENCE_CONDITIONS, type ReferenceConditionId } from '#shared/physics/index.ts'
import { MODEL_LABEL } from '#shared/schemas/gas.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, inputClass, Select } from '#src/components/ui/field.tsx'
import { SafetyBadge, severityToState } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, PageHeader } from '#src/components/ui/states.tsx'
import { cn } from '#src/lib/cn.ts'
import { fmt, type PressureDisplayUnit, sig, TEMPERATURE_SYMBOL, type TemperatureDisplayUnit, unitToKelvin, unitToPa } from '#src/lib/format.ts'
import { GASES } from '#shared/physics/index.ts'
import {
  type AmountInput,
  amountEquivalents,
  BASIS_LABEL,
  type Basis,
  bestModel,
  compositionTable,
  cylinderEquivalents,
  FRACTION_LABEL,
  FRACTION_SCALE,
  type FractionUnit,
  STANDARD_REFERENCES,
  toMoleFractions,
} from '../lib/convert.ts'

interface Row {
  gas: string
  value: string
}

function num(s: string): number {
  return s.trim() === '' ? Number.NaN : Number(s.replace(',', '.'))
}

function errorText(err: unknown): string {
  return err instanceof Error ? err.message : String(err)
}

export function Component() {
  const { units } = useDisplayUnits()
  const [rows, setRows] = useState<Row[]>([
    { gas: 'carbon-monoxide', value: '50' },
    { gas: 'nitrogen', value: '999950' },
  ])
  const [basis, setBasis] = useState<Basis>('mole')
  const [inUnit, setInUnit] = useState<FractionUnit>('ppm')
  const [outUnit, setOutUnit] = useState<FractionUnit>('ppm')
  const [temperature, setTemperature] = useState(units.temperature === 'degF' ? '68' : '20')
  const [tUnit, setTUnit] = useState<TemperatureDisplayUnit>(units.temperature)
  const [pressure, setPressure] = useState(units.pressure === 'psi' ? '14.696' : units.pressure === 'kPa' ? '101.325' : '1.01325')
  const [pUnit, setPUnit] = useState<PressureDisplayUnit>(units.pressure)
  const [modelChoice, setModelChoice] = useState<'auto' | ModelId>('auto')
  const [amount, setAmount] = useState('1')
  const [amountKind, setAmountKind] = useState<'mol' | 'kg' | ReferenceConditionId>('mol')
  const [amountVolUnit, setAmountVolUnit] = useState<'m3' | 'ft3'>('m3')
  const [cylL, setCylL] = useState('10')
  const [cylP, setCylP] = useState('150')
  const [cylRef, setCylRef] = useState<'gauge' | 'absolute'>('gauge')

  const inputs = useDeferredValue({
    rows,
    basis,
    inUnit,
    temperature,
    tUnit,
    pressure,
    pUnit,
    modelChoice,
    amount,
    amountKind,
    amountVolUnit,
    cylL,
    cylP,
    cylRef,
  })

  const computed = useMemo(() => {
    const gasIds = inputs.rows.map((r) => r.gas)
    const values = inputs.rows.map((r) => num(r.value))
    const T = unitToKelvin(num(inputs.temperature), inputs.tUnit)
    const p = unitToPa(num(inputs.pressure), inputs.pUnit)
    if (!(T > 0)) return { error: 'Enter a temperature above absolute zero.' }
    if (!(p > 0)) return { error: 'Enter an absolute pressure above 0.' }
    if (values.some((v, i) => !Number.isFinite(v) && !(inputs.basis === 'mg/m3' && i === values.length - 1))) return { error: 'Enter a number on every row.' }
    const model = inputs.modelChoice === 'auto' ? bestModel(gasIds) : inputs.modelChoice
    try {
      const mixture = toMoleFractions(gasIds, values, inputs.basis, inputs.inUnit, model, T, p)
      const table = compositionTable(mixture, model, T, p)
      const M = mixtureMolarMassKgPerMol(mixture)
      const a = num(inputs.amount)
      let equivalents: ReturnType<typeof amountEquivalents> | null = null
      let amountError: string | null = null
      try {
        if (!(a >= 0)) throw new Error('Enter an amount of 0 or more.')
        const ai: AmountInput =
          inputs.amountKind === 'mol' || inputs.amountKind === 'kg'
            ? { kind: inputs.amountKind, value: a }
            : { kind: 'std', value: a, referenceId: inputs.amountKind, unit: inputs.amountVolUnit }
        equivalents = amountEquivalents(mixture, model, ai, M)
      } catch (err) {
        amountError = errorText(err)
      }
      let cylinder: ReturnType<typeof cylinderEquivalents> | null = null
      let cylinderError: string | null = null
      try {
        const V = num(inputs.cylL) / 1000
        const cp = unitToPa(num(inputs.cylP), inputs.pUnit) + (inputs.cylRef === 'gauge' ? 101_325 : 0)
        if (!(V > 0)) throw new Error('Enter the water volume in litres (above 0).')
        cylinder = cylinderEquivalents(mixture, model, V, T, cp)
      } catch (err) {
        cylinderError = errorText(err)
      }
      return { mixture, table, model, equivalents, amountError, cylinder, cylinderError }
    } catch (err) {
      return { error: errorText(err) }
    }
  }, [inputs])

  const scale = FRACTION_SCALE[outUnit]
  const stated = `${fmt(num(temperature), 2)} ${TEMPERATURE_SYMBOL[tUnit]}, ${pressure} ${pUnit} absolute`
  const frac = (x: number) => fmt(x / scale, outUnit === 'percent' ? 5 : outUnit === 'ppm' ? 3 : 1)

  return (
    <div>
      <PageHeader
        title="Conversions"
        subtitle="Composition quantities (ISO 14912), standard volumes and cylinder contents. Computed in your browser; every volume states its conditions."
      />
      <div className="grid gap-5 xl:grid-cols-[minmax(0,28rem)_minmax(0,1fr)]">
        <Card title="Composition as given">
          <div className="space-y-3">
            <Field label="Given as">
              {(id) => (
                <Select id={id} value={basis} onChange={(e) => setBasis(e.target.value as Basis)}>
                  {(Object.keys(BASIS_LABEL) as Basis[]).map((b) => (
                    <option key={b} value={b}>
                      {BASIS_LABEL[b]}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
            {basis !== 'mg/m3' ? (
              <Field label="Unit of the values">
                {(id) => (
                  <Select id={id} value={inUnit} onChange={(e) => setInUnit(e.target.value as FractionUnit)}>
                    <option value="percent">% (per hundred)</option>
                    <option value="ppm">ppm (per million)</option>
                    <option value="ppb">ppb (per billion)</option>
                  </Select>
                )}
              </Field>
            ) : (
              <p className="text-xs text-ink-600">Enter mg/m³ for each minor component; the last row is the balance gas and makes up the rest.</p>
            )}
            <fieldset className="min-w-0 space-y-2">
              <legend className="text-sm font-medium text-ink-800">Components</legend>
              {rows.map((r, i) => {
                const g = GASES.find((x) => x.id === r.gas)
                const isBalance = basis === 'mg/m3' && i === rows.length - 1
                return (
                  <div key={i} className="flex items-center gap-2">
                    <span className="w-14 text-center">{g && <GasChip formula={g.formula} name={g.name} />}</span>
                    <label className="sr-only" htmlFor={`conv-gas-${i}`}>
                      Gas {i + 1}
                    </label>
                    <select
                      id={`conv-gas-${i}`}
                      className={cn(inputClass, 'min-w-0 flex-1')}
                      value={r.gas}
                      onChange={(e) => setRows(rows.map((x, k) => (k === i ? { ...x, gas: e.target.value } : x)))}
                    >
                      {GASES.map((x) => (
                        <option key={x.id} value={x.id}>
                          {x.formula} — {x.name}
                        </option>
                      ))}
                    </select>
                    <label className="sr-only" htmlFor={`conv-val-${i}`}>
                      Value of gas {i + 1}
                    </label>
                    <input
                      id={`conv-val-${i}`}
                      className={cn(inputClass, 'num w-32 text-right')}
                      inputMode="decimal"
                      disabled={isBalance}
                      value={isBalance ? 'balance' : r.value}
                      onChange={(e) => setRows(rows.map((x, k) => (k === i ? { ...x, value: e.target.value } : x)))}
                    />
                    <Button
                      variant="ghost"
                      size="sm"
                      className="min-h-10"
                      aria-label={`Remove gas ${i + 1}`}
                      disabled={rows.length <= 1}
                      onClick={() => setRows(rows.filter((_, k) => k !== i))}
                    >
                      Remove
                    </Button>
                  </div>
                )
              })}
              <Button variant="secondary" size="sm" onClick={() => setRows([...rows, { gas: 'nitrogen', value: '0' }])}>
                Add gas
              </Button>
            </fieldset>
            <div className="grid grid-cols-[1fr_auto] items-end gap-2">
              <Field label="Stated temperature">
                {(id) => <Input id={id} className="num" inputMode="decimal" value={temperature} onChange={(e) => setTemperature(e.target.value)} />}
              </Field>
              <Field label="Unit">
                {(id) => (
                  <Select id={id} value={tUnit} onChange={(e) => setTUnit(e.target.value as TemperatureDisplayUnit)}>
                    <option value="degC">°C</option>
                    <option value="degF">°F</option>
                  </Select>
                )}
              </Field>
            </div>
            <div className="grid grid-cols-[1fr_auto] items-end gap-2">
              <Field label="Stated pressure (absolute)">
                {(id) => <Input id={id} className="num" inputMode="decimal" value={pressure} onChange={(e) => setPressure(e.target.value)} />}
              </Field>
              <Field label="Unit">
                {(id) => (
                  <Select id={id} value={pUnit} onChange={(e) => setPUnit(e.target.value as PressureDisplayUnit)}>
                    <option value="bar">bar</option>
                    <option value="psi">psi</option>
                    <option value="kPa">kPa</option>
                  </Select>
                )}
              </Field>
            </div>
            <Field
              label="Compression factors from"
              hint="Volume fractions and concentrations depend on Z of each pure gas and of the mixture at the stated conditions."
            >
              {(id, d) => (
                <Select id={id} aria-describedby={d} value={modelChoice} onChange={(e) => setModelChoice(e.target.value as 'auto' | ModelId)}>
                  <option value="auto">GERG-2008 where it covers the gases, else Peng–Robinson</option>
                  {(['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008'] as ModelId[]).map((m) => (
                    <option key={m} value={m}>
                      {MODEL_LABEL[m]}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          </div>
        </Card>

        <div className="space-y-5">
          <Card
            title={`Composition at ${stated}`}
            actions={
              <label className="flex items-center gap-2 text-sm">
                Show fractions in
                <select className={cn(inputClass, 'min-h-8')} value={outUnit} onChange={(e) => setOutUnit(e.target.value as FractionUnit)}>
                  <option value="percent">%</option>
                  <option value="ppm">ppm</option>
                  <option value="ppb">ppb</option>
                </select>
              </label>
            }
          >
            {'error' in computed ? (
              <EmptyState title="Cannot convert yet">{computed.error}</EmptyState>
            ) : (
              <>
                <ScrollRegion label="Composition table">
                  <table className="w-full text-sm">
                    <caption className="sr-only">The composition in every ISO 14912 quantity</caption>
                    <thead>
                      <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                        <th scope="col" className="py-2 pr-3">
                          Gas
                        </th>
                        <th scope="col" className="py-2 pr-3 text-right">
                          Amount fraction, {FRACTION_LABEL[outUnit]} mol/mol
                        </th>
                        <th scope="col" className="py-2 pr-3 text-right">
                          Mass fraction, {FRACTION_LABEL[outUnit]}
                        </th>
                        <th scope="col" className="py-2 pr-3 text-right">
                          Volume fraction, {FRACTION_LABEL[outUnit]}
                        </th>
                        <th scope="col" className="py-2 pr-3 text-right">
                          mg/m³
                        </th>
                        <th scope="col" className="py-2 text-right">
                          mol/m³
                        </th>
                      </tr>
                    </thead>
                    <tbody>
                      {computed.mixture.gasIds.map((id, i) => {
                        const g = getGas(id)
                        return (
                          <tr key={id + i} className="border-b border-ink-100">
                            <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                              <GasChip formula={g.formula} name={g.name} showName />
                            </th>
                            <td className="num py-1.5 pr-3 text-right">{frac(computed.table.mole[i])}</td>
                            <td className="num py-1.5 pr-3 text-right">{frac(computed.table.mass[i])}</td>
                            <td className="num py-1.5 pr-3 text-right">{computed.table.volume ? frac(computed.table.volume[i]) : '—'}</td>
                            <td className="num py-1.5 pr-3 text-right">{sig(computed.table.massConcentrationMgPerM3[i], 5)}</td>
                            <td className="num py-1.5 text-right">{sig(computed.table.molarConcentrationMolPerM3[i], 5)}</td>
                          </tr>
                        )
                      })}
                    </tbody>
                  </table>
                </ScrollRegion>
                <p className="mt-2 text-xs text-ink-600">
                  ISO 14912: w = x·M/Σx·M; φ = x·Z<sub>i</sub>/Σx·Z (pure-gas volumes before mixing, at the stated conditions); γ = x·M·p/(Z·R·T). Compression
                  factors: {MODEL_LABEL[computed.model]}. Amount and mass fractions do not depend on the conditions; volume fractions and concentrations do.
                </p>
                {computed.table.warnings.map((w, i) => (
                  <p key={i} className="mt-2 flex flex-wrap items-start gap-2 text-sm">
                    <SafetyBadge state={severityToState(w.severity)} />
                    <span>{w.message}</span>
                  </p>
                ))}
              </>
            )}
          </Card>

          <Card title="Standard volumes of an amount of this mixture">
            <div className="flex flex-wrap items-end gap-2">
              <Field label="Amount">
                {(id) => <Input id={id} className="num w-32" inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} />}
              </Field>
              <Field label="Given as">
                {(id) => (
                  <Select id={id} value={amountKind} onChange={(e) => setAmountKind(e.target.value as typeof amountKind)}>
                    <option value="mol">mol</option>
                    <option value="kg">kg</option>
                    {STANDARD_REFERENCES.map((r) => (
                      <option key={r} value={r}>
                        standard volume at {REFERENCE_CONDITIONS.find((x) => x.id === r)!.label}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              {amountKind !== 'mol' && amountKind !== 'kg' && (
                <Field label="Volume unit">
                  {(id) => (
                    <Select id={id} value={amountVolUnit} onChange={(e) => setAmountVolUnit(e.target.value as 'm3' | 'ft3')}>
                      <option value="m3">m³</option>
                      <option value="ft3">ft³</option>
                    </Select>
                  )}
                </Field>
              )}
            </div>
            {'error' in computed ? null : computed.amountError ? (
              <p className="mt-3 text-sm text-blocked-fg" role="alert">
                {computed.amountError}
              </p>
            ) : (
              computed.equivalents && <Equivalents eq={computed.equivalents} />
            )}
          </Card>

          <Card title="Cylinder contents at the stated temperature">
            <div className="flex flex-wrap items-end gap-2">
              <Field label="Water volume, L">
                {(id) => <Input id={id} className="num w-28" inputMode="decimal" value={cylL} onChange={(e) => setCylL(e.target.value)} />}
              </Field>
              <Field label={`Cylinder pressure, ${pUnit}`}>
                {(id) => <Input id={id} className="num w-28" inputMode="decimal" value={cylP} onChange={(e) => setCylP(e.target.value)} />}
              </Field>
              <Field label="Gauge or absolute">
                {(id) => (
                  <Select id={id} value={cylRef} onChange={(e) => setCylRef(e.target.value as 'gauge' | 'absolute')}>
                    <option value="gauge">gauge (standard atmosphere added)</option>
                    <option value="absolute">absolute</option>
                  </Select>
                )}
              </Field>
            </div>
            {'error' in computed ? null : computed.cylinderError ? (
              <p className="mt-3 text-sm text-blocked-fg" role="alert">
                {computed.cylinderError}
              </p>
            ) : (
              computed.cylinder && (
                <>
                  <p className="num mt-3 text-sm text-ink-700">
                    Z = {fmt(computed.cylinder.compressibility, 4)} ({MODEL_LABEL[computed.model]})
                  </p>
                  <Equivalents eq={computed.cylinder} />
                </>
              )
            )}
          </Card>
        </div>
      </div>
    </div>
  )
}

function Equivalents({ eq }: { eq: ReturnType<typeof amountEquivalents> }) {
  return (
    <table className="mt-3 w-full text-sm">
      <caption className="sr-only">The same amount as mol, kg and standard volumes</caption>
      <tbody>
        <tr className="border-b border-ink-100">
          <th scope="row" className="py-1.5 pr-3 text-left font-normal text-ink-700">
            Amount
          </th>
          <td className="num py-1.5 text-right">{sig(eq.amountMol, 5)} mol</td>
          <td className="num py-1.5 text-right">{sig(eq.massKg, 5)} kg</td>
        </tr>
        {eq.volumes.map((v) => (
          <tr key={v.id} className="border-b border-ink-100">
            <th scope="row" className="py-1.5 pr-3 text-left font-normal text-ink-700">
              Standard volume at {v.label}
            </th>
            <td className="num py-1.5 text-right">{sig(v.m3, 5)} m³</td>
            <td className="num py-1.5 text-right">{sig(v.ft3, 5)} ft³</td>
          </tr>
        ))}
      </tbody>
    </table>
  )
}
