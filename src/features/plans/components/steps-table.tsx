import { Fragment } from 'react'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import type { FillPlanRequest, FillPlanResponse } from '#shared/schemas/fill-plan.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { formulaOf, massText, nameOf, pressureDecimals, pressureText, temperatureText } from '../lib/format-plan.ts'
import { Finding } from './findings.tsx'

/**
 * The plan's steps: what to connect, the cumulative target (gauge and absolute) at the fill temperature, the window
 * that keeps every component in tolerance, the mass added and the cumulative scale reading. Findings about a step
 * are shown directly under it.
 */
export function StepsTable({ plan, request }: { plan: FillPlanResponse; request: Pick<FillPlanRequest, 'gauge'> }) {
  const unit = plan.finalPressure.unit
  const d = pressureDecimals(request, unit)
  const gravimetric = plan.method === 'gravimetric'
  return (
    <ScrollRegion label="Steps table">
      <table className="w-full text-sm">
        <caption className="pb-2 text-left text-xs text-ink-600">
          Cumulative targets at the fill temperature {temperatureText(plan.fillTemperature)}; gauge = absolute − {pressureText(plan.atmosphericPressure, d + 3)}
          .
          {gravimetric
            ? ' Gravimetric: the scale reading decides; pressures are for reference.'
            : ' Partial pressure: read the gauge after the gas has settled.'}
        </caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-2 text-right">
              #
            </th>
            <th scope="col" className="py-2 pr-2">
              Connect
            </th>
            <th scope="col" className="py-2 pr-2 text-right">
              Target
              <span className="block font-normal normal-case">gauge / absolute</span>
            </th>
            <th scope="col" className="py-2 pr-2 text-right">
              {gravimetric ? 'Scale window' : 'Window, gauge'}
            </th>
            <th scope="col" className="py-2 pr-2 text-right">
              Mass added
            </th>
            <th scope="col" className="py-2 text-right">
              Scale reading
            </th>
          </tr>
        </thead>
        <tbody>
          {plan.steps.map((s) => {
            const notes = plan.warnings.filter((w) => w.step === s.index)
            const premix = s.sourceComposition.length > 1
            return (
              <Fragment key={s.index}>
                <tr className={notes.length ? '' : 'border-b border-ink-100'}>
                  <td className="num py-2 pr-2 text-right align-top font-semibold">{s.index + 1}</td>
                  <th scope="row" className="py-2 pr-2 text-left align-top font-normal">
                    {premix ? (
                      <span className="text-sm">
                        <span className="font-medium">{s.source}</span>
                        <span className="block text-xs text-ink-600">premix: {s.sourceComposition.map((c) => formulaOf(c.gas)).join(' / ')}</span>
                      </span>
                    ) : (
                      <GasChip formula={formulaOf(s.gas)} name={nameOf(s.gas)} />
                    )}
                  </th>
                  <td className="num whitespace-nowrap py-2 pr-2 text-right align-top">
                    <span className="text-base font-semibold">{pressureText(s.cumulativeGaugePressure, d)}</span>
                    <span className="block text-xs text-ink-600">{pressureText(s.cumulativePressure, d)}</span>
                  </td>
                  <td className="num whitespace-nowrap py-2 pr-2 text-right align-top text-xs">
                    {gravimetric ? (
                      <>
                        {massText(s.toleranceWindow.cumulativeMassLow)} –<span className="block">{massText(s.toleranceWindow.cumulativeMassHigh)}</span>
                      </>
                    ) : (
                      <>
                        {pressureText(s.toleranceWindow.gaugePressureLow, d)} –
                        <span className="block">{pressureText(s.toleranceWindow.gaugePressureHigh, d)}</span>
                      </>
                    )}
                  </td>
                  <td className="num whitespace-nowrap py-2 pr-2 text-right align-top">{massText(s.massAdded)}</td>
                  <td className="num whitespace-nowrap py-2 text-right align-top">{massText(s.cumulativeMass)}</td>
                </tr>
                {notes.length > 0 && (
                  <tr className="border-b border-ink-100">
                    <td />
                    <td colSpan={5} className="pb-2">
                      <ul className="space-y-1.5" aria-label={`Findings for step ${s.index + 1}`}>
                        {notes.map((w, i) => (
                          <Finding key={`${w.code}-${i}`} warning={w} />
                        ))}
                      </ul>
                    </td>
                  </tr>
                )}
              </Fragment>
            )
          })}
        </tbody>
      </table>
    </ScrollRegion>
  )
}

/** The same contents read at other gas temperatures (constant density): what the gauge shows when the cylinder is warmer or cooler. */
export function TemperatureTable({ plan, request }: { plan: FillPlanResponse; request: Pick<FillPlanRequest, 'gauge'> }) {
  const temps = plan.steps[0]?.temperatureTable ?? []
  if (!temps.length) return null
  const unit = plan.finalPressure.unit
  const d = pressureDecimals(request, unit)
  return (
    <ScrollRegion label="Temperature table">
      <table className="w-full text-sm">
        <caption className="pb-2 text-left text-xs text-ink-600">
          Gauge target ({unit} g) if the gas is at another temperature when read; same contents.
        </caption>
        <thead>
          <tr className="border-b border-ink-200 text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-2 text-left">
              Step
            </th>
            {temps.map((t) => (
              <th key={t.temperature.value} scope="col" className="py-2 pr-2 text-right">
                {temperatureText(t.temperature, 0)}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {plan.steps.map((s) => (
            <tr key={s.index} className="border-b border-ink-100">
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                {s.index + 1} · {s.sourceComposition.length > 1 ? s.source : formulaOf(s.gas)}
              </th>
              {s.temperatureTable.map((t) => (
                <td key={t.temperature.value} className="num whitespace-nowrap py-1.5 pr-2 text-right">
                  {pressureText({ value: t.gaugePressure.value, unit: t.gaugePressure.unit }, d)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  )
}
