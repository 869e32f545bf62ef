import type { ReactNode } from 'react'
import { type GasDto, MODEL_LABEL } from '#shared/schemas/gas.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'

const SOURCE_LABEL: Record<string, string> = {
  identity: 'Identity (name, formula, CAS)',
  molarMass: 'Molar mass',
  criticalPoint: 'Critical point',
  acentricFactor: 'Acentric factor',
  normalBoilingPoint: 'Normal boiling point',
  vapourPressure: 'Vapour pressure',
  flammability: 'Flammability limits',
  iso10156: 'ISO 10156 coefficients',
  toxicity: 'Toxicity (LC50)',
  hazards: 'Hazard flags',
}

const STATUS_WORD = { definition: 'definition', published: 'published value', unverified: 'unverified (from memory)' } as const

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[11rem_1fr] gap-3 border-b border-ink-100 py-1.5 text-sm last:border-b-0">
      <dt className="text-ink-600">{label}</dt>
      <dd className="num text-ink-900">{children}</dd>
    </div>
  )
}

/** Everything the library holds about one gas, each group of values next to where it came from. */
export function GasDetail({ gas }: { gas: GasDto }) {
  const hazardous = gas.hazards.filter((h) => ['flammable', 'oxidiser', 'toxic', 'corrosive', 'pyrophoric', 'unstable'].includes(h))
  return (
    <article aria-labelledby={`gas-${gas.id}-title`} className="space-y-4">
      <header className="flex flex-wrap items-center gap-3">
        <GasChip formula={gas.formula} className="text-base" />
        <h2 id={`gas-${gas.id}-title`} className="text-lg font-semibold text-ink-900">
          {gas.name}
        </h2>
        <span className="text-sm text-ink-600">CAS {gas.casNumber}</span>
      </header>
      {hazardous.length > 0 && (
        <div className="flex flex-wrap items-center gap-2">
          <SafetyBadge state="caution" label={`Hazards: ${hazardous.join(', ')}`} />
          {gas.hazards.includes('oxidiser') && <span className="text-xs text-ink-700">Oxygen-clean equipment and slow valve opening; follow local codes.</span>}
          {gas.hazards.includes('toxic') && (
            <span className="text-xs text-ink-700">Handle in a ventilated enclosure with detection; follow local codes and licensed practice.</span>
          )}
          {gas.hazards.includes('flammable') && (
            <span className="text-xs text-ink-700">Keep away from oxidisers and ignition sources; purge with inert gas.</span>
          )}
        </div>
      )}
      <dl>
        <Row label="Molar mass">{gas.molarMass.value} g/mol</Row>
        <Row label="Critical temperature">
          {gas.criticalTemperature.value} K ({(gas.criticalTemperature.value - 273.15).toFixed(2)} °C)
        </Row>
        <Row label="Critical pressure">
          {gas.criticalPressure.value.toFixed(4)} MPa ({(gas.criticalPressure.value * 10).toFixed(3)} bar absolute)
        </Row>
        <Row label="Acentric factor ω">{gas.acentricFactor}</Row>
        <Row label={gas.normalBoilingPoint.sublimation ? 'Sublimation point' : 'Normal boiling point'}>
          {gas.normalBoilingPoint.value} K ({(gas.normalBoilingPoint.value - 273.15).toFixed(2)} °C) at 101.325 kPa
        </Row>
        <Row label="Vapour pressure">
          {gas.vapourPressure ? (
            <>
              {gas.vapourPressure.equation}; valid {gas.vapourPressure.validFrom.value}–{gas.vapourPressure.validTo.value} K
              <span className="block text-xs text-ink-600">
                {Object.entries(gas.vapourPressure.coefficients)
                  .map(([k, v]) => `${k} = ${v}`)
                  .join(', ')}
              </span>
            </>
          ) : (
            'no correlation in the library'
          )}
        </Row>
        <Row label="Flammability in air">
          {gas.flammability ? `${gas.flammability.lowerLimit.value} – ${gas.flammability.upperLimit.value} % by volume` : 'not flammable'}
        </Row>
        <Row label="ISO 10156">
          {gas.iso10156 ? (
            <>
              {[
                gas.iso10156.tci && `Tci ${gas.iso10156.tci.value} %`,
                gas.iso10156.kEquivalent !== null && `K ${gas.iso10156.kEquivalent}`,
                gas.iso10156.ci !== null && `Ci ${gas.iso10156.ci}`,
              ]
                .filter(Boolean)
                .join(' · ')}{' '}
              <span className="text-xs text-ink-600">
                ({STATUS_WORD[gas.iso10156.status]}
                {gas.iso10156.confidence === 'low' ? ', low confidence' : ''})
              </span>
            </>
          ) : (
            'no coefficient'
          )}
        </Row>
        <Row label="LC50">
          {gas.toxicity ? (
            <>
              {gas.toxicity.lc50.value} {gas.toxicity.lc50.unit} <span className="text-xs text-ink-600">({STATUS_WORD[gas.toxicity.status]})</span>
            </>
          ) : (
            'not classified toxic'
          )}
        </Row>
        <Row label="Equations of state">{gas.models.map((m) => MODEL_LABEL[m]).join(', ')}</Row>
        {gas.composition && <Row label="Evaluated as">{gas.composition.map((c) => `${(c.fraction * 100).toFixed(2)} % ${c.gas}`).join(' + ')}</Row>}
      </dl>
      {gas.notes.length > 0 && (
        <section>
          <h3 className="text-sm font-semibold text-ink-800">Notes</h3>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm text-ink-700">
            {gas.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </section>
      )}
      <section>
        <h3 className="text-sm font-semibold text-ink-800">Sources</h3>
        <dl className="mt-1">
          {Object.entries(gas.sources).map(([k, v]) => (
            <Row key={k} label={SOURCE_LABEL[k] ?? k}>
              <span className="text-ink-700">{v}</span>
            </Row>
          ))}
        </dl>
      </section>
    </article>
  )
}
