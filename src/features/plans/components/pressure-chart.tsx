import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import type { CompareModelsResponse } from '#shared/schemas/fill-plan.ts'
import { MODEL_LABEL, type ModelIdWire } from '#shared/schemas/gas.ts'
import { formulaOf } from '../lib/format-plan.ts'

/** Shade and dash pattern per model, so the chart reads without colour and in black and white. */
const STYLE: Record<ModelIdWire, { stroke: string; dash?: string }> = {
  ideal: { stroke: '#8791a0', dash: '2 4' },
  'van-der-waals': { stroke: '#cf7a4b', dash: '8 4' },
  srk: { stroke: '#404857', dash: '4 2 1 2' },
  'peng-robinson': { stroke: '#9a4c24', dash: '12 3' },
  'gerg-2008': { stroke: '#1b1f26' },
}

/**
 * Cumulative gauge target after each step, one line per equation of state: where the models part company is where
 * the choice of model matters. Loaded lazily (recharts).
 */
export default function PressureChart({ comparison, selected }: { comparison: CompareModelsResponse; selected: ModelIdWire }) {
  const withPlans = comparison.entries.filter((e) => e.plan)
  const first = withPlans[0]?.plan
  if (!first) return null
  const unit = first.finalGaugePressure.unit
  const data = first.steps.map((s, i) => ({
    step: `${i + 1} ${s.sourceComposition.length > 1 ? 'premix' : formulaOf(s.gas)}`,
    ...Object.fromEntries(withPlans.map((e) => [e.model, e.plan?.steps[i]?.cumulativeGaugePressure.value ?? null])),
  }))
  return (
    <figure>
      <div
        className="h-72 w-full"
        role="img"
        aria-label={`Cumulative gauge pressure after each step for ${withPlans.map((e) => MODEL_LABEL[e.model]).join(', ')}`}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 12, bottom: 8, left: 4 }}>
            <CartesianGrid stroke="#eceef1" />
            <XAxis dataKey="step" />
            <YAxis domain={[0, 'auto']} tickFormatter={(v: number) => v.toFixed(0)} label={{ value: `${unit} gauge`, angle: -90, position: 'insideLeft' }} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? `${v.toFixed(2)} ${unit} g` : String(v))} />
            <Legend verticalAlign="top" />
            {withPlans.map((e) => (
              <Line
                key={e.model}
                type="linear"
                dataKey={e.model}
                name={`${MODEL_LABEL[e.model]}${e.model === selected ? ' (this plan)' : ''}`}
                stroke={STYLE[e.model].stroke}
                strokeDasharray={STYLE[e.model].dash}
                strokeWidth={e.model === selected ? 3 : 1.5}
                dot={{ r: e.model === selected ? 4 : 2 }}
                isAnimationActive={false}
              />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-ink-600">Cumulative target after each step at the fill temperature, {unit} gauge.</figcaption>
    </figure>
  )
}
