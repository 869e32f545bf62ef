import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import { MODEL_LABEL } from '#shared/schemas/gas.ts'
import type { ZCurvePoint } from '../lib/compute.ts'

/** Lines differ by dash pattern as well as shade, so the chart reads in black and white and without colour vision. */
export const MODEL_LINE_STYLE: Record<string, { stroke: string; dash?: string }> = {
  ideal: { stroke: '#8791a0', dash: '2 4' },
  'van-der-waals': { stroke: '#cf7a4b', dash: '8 4' },
  srk: { stroke: '#404857', dash: '4 2 1 2' },
  'peng-robinson': { stroke: '#9a4c24', dash: '12 3' },
  'gerg-2008': { stroke: '#1b1f26' },
}

/** Compressibility factor against absolute pressure per model, at one temperature. Loaded lazily (recharts). */
export default function ZChart({ points, temperatureLabel }: { points: ZCurvePoint[]; temperatureLabel: string }) {
  const models = Object.keys(MODEL_LINE_STYLE).filter((m) => points.some((p) => p[m] !== null && p[m] !== undefined))
  return (
    <figure>
      <div
        className="h-80 w-full"
        role="img"
        aria-label={`Compressibility factor Z against absolute pressure from 1 to 300 bar at ${temperatureLabel}, one line per equation of state`}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={points} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke="#eceef1" />
            <XAxis
              dataKey="pressureBar"
              type="number"
              domain={[0, 'dataMax']}
              tickCount={7}
              label={{ value: 'Pressure, bar absolute', position: 'insideBottom', offset: -12 }}
            />
            <YAxis domain={['auto', 'auto']} tickFormatter={(v: number) => v.toFixed(2)} label={{ value: 'Z', angle: -90, position: 'insideLeft' }} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? v.toFixed(4) : String(v))} labelFormatter={(l) => `${l} bar absolute`} />
            <Legend verticalAlign="top" />
            {models.map((m) => (
              <Line
                key={m}
                type="monotone"
                dataKey={m}
                name={MODEL_LABEL[m as keyof typeof MODEL_LABEL]}
                stroke={MODEL_LINE_STYLE[m].stroke}
                strokeDasharray={MODEL_LINE_STYLE[m].dash}
                strokeWidth={2}
                dot={false}
                connectNulls={false}
                isAnimationActive={false}
              />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-ink-600">Z = p·v/(R·T) at {temperatureLabel}. Models that do not cover the mixture draw no line.</figcaption>
    </figure>
  )
}
