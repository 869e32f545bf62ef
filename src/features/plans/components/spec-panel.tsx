import { FILL_METHOD_LABEL } from '#shared/schemas/order.ts'
import { ORDER_STATUS_LABEL } from '#shared/schemas/order-lifecycle.ts'
import type { PlanCylinderRef, PlanLineSpec } from '#shared/schemas/plan.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { formulaOf, inSpecUnits, nameOf, specUnitOf } from '../lib/format-plan.ts'

/** The order line's specification: what the customer asked for, as the plan must deliver it. */
export function SpecPanel({ line }: { line: PlanLineSpec }) {
  return (
    <div className="space-y-3 text-sm">
      <div>
        <p className="text-xs uppercase tracking-wide text-ink-600">
          Order {line.order.number} · line {line.lineNo} · {ORDER_STATUS_LABEL[line.order.status]}
        </p>
        <p className="font-semibold text-ink-900">{line.description}</p>
        <p className="text-ink-700">{line.order.customer}</p>
        {line.order.neededBy && <p className="text-xs text-ink-600">Needed by {line.order.neededBy}</p>}
      </div>
      <table className="w-full">
        <caption className="sr-only">Specified composition</caption>
        <tbody>
          {line.components.map((c) => (
            <tr key={c.gas} className="border-b border-ink-100">
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                <GasChip formula={formulaOf(c.gas)} name={nameOf(c.gas)} showName />
              </th>
              <td className="num py-1 text-right">
                {c.gas === line.balanceGas
                  ? 'balance'
                  : c.amount !== undefined && c.unit
                    ? `${c.amount} ${c.unit === 'percent' ? '%' : c.unit}`
                    : inSpecUnits(c.fraction, specUnitOf(c.gas, line, c.fraction))}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <dl className="grid grid-cols-[9rem_1fr] gap-x-2 gap-y-1">
        <dt className="text-ink-600">Fill pressure</dt>
        <dd className="num">{line.finalPressureBarGauge} bar g, settled at 15 °C</dd>
        <dt className="text-ink-600">Blend tolerance</dt>
        <dd>±{line.blendTolerancePct} % relative</dd>
        <dt className="text-ink-600">Certification</dt>
        <dd>±{line.certificationUncertaintyPct} % relative (k = 2)</dd>
        <dt className="text-ink-600">Cylinders</dt>
        <dd>
          {line.quantity} × {line.waterVolumeL} L, valve {line.valveOutlet}
        </dd>
        <dt className="text-ink-600">Method asked</dt>
        <dd>{FILL_METHOD_LABEL[line.method]}</dd>
      </dl>
    </div>
  )
}

export function CylinderSummary({ cylinder }: { cylinder: PlanCylinderRef | null }) {
  if (!cylinder)
    return <p className="text-sm text-ink-700">No cylinder chosen: planned for the line’s cylinder size, evacuated. Check the cylinder before filling.</p>
  const r = cylinder.residual
  return (
    <dl className="grid grid-cols-[9rem_1fr] gap-x-2 gap-y-1 text-sm">
      <dt className="text-ink-600">Cylinder</dt>
      <dd className="font-medium">{cylinder.serial}</dd>
      <dt className="text-ink-600">Water volume</dt>
      <dd className="num">
        {cylinder.waterVolumeL} L, {cylinder.material}
      </dd>
      <dt className="text-ink-600">Service / test</dt>
      <dd className="num">
        {cylinder.servicePressureBar} / {cylinder.testPressureBar} bar g
      </dd>
      <dt className="text-ink-600">Next test</dt>
      <dd className="num">{cylinder.nextTestDate}</dd>
      <dt className="text-ink-600">Oxygen-clean</dt>
      <dd>{cylinder.oxygenClean ? 'yes' : 'no'}</dd>
      <dt className="text-ink-600">Contents now</dt>
      <dd>
        {r.kind === 'evacuated'
          ? 'evacuated'
          : `${r.pressureBarGauge ?? 0} bar g of ${(r.composition ?? []).map((c) => `${(c.fraction * 100).toFixed(1)} % ${formulaOf(c.gas)}`).join(', ') || 'unknown gas'}`}
      </dd>
    </dl>
  )
}
