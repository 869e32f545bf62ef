import { type InputHTMLAttributes, useState } from 'react'
import { barGaugeToDisplay, displayToBarGauge } from '#src/components/order/format.ts'
import { Input } from '#src/components/ui/field.tsx'
import type { DisplayUnits } from '#src/components/units-context.tsx'

type Props = Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange' | 'type'> & {
  /** bar gauge (NaN while the text is not a number) */
  value: number
  onChange: (barGauge: number) => void
  unit: DisplayUnits['pressure']
}

function toText(barGauge: number, unit: DisplayUnits['pressure']): string {
  if (!Number.isFinite(barGauge)) return ''
  const v = barGaugeToDisplay(barGauge, unit)
  return String(Number(v.toFixed(unit === 'bar' ? 3 : 1)))
}

/** A gauge pressure typed in the user's display unit and held in bar gauge. Give it a `key` per unit. */
export function PressureGaugeInput({ value, onChange, unit, ...props }: Props) {
  const [text, setText] = useState(() => toText(value, unit))
  return (
    <Input
      {...props}
      type="text"
      inputMode="decimal"
      value={text}
      onChange={(e) => {
        setText(e.target.value)
        const n = Number(e.target.value.replace(',', '.'))
        onChange(e.target.value.trim() === '' || !Number.isFinite(n) ? Number.NaN : displayToBarGauge(n, unit))
      }}
    />
  )
}
