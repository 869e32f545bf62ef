import { type InputHTMLAttributes, useState } from 'react'
import { parseMoneyToMinor } from '#shared/schemas/pricing.ts'
import { Input } from '#src/components/ui/field.tsx'

type Props = Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange' | 'type'> & {
  /** minor units (cents); NaN while the text is not an amount */
  value: number
  onChange: (minor: number) => void
}

/** An amount typed as "4.20", held as integer minor units. Keeps the user's text while they type. */
export function MoneyInput({ value, onChange, ...props }: Props) {
  const [text, setText] = useState(() => (Number.isFinite(value) ? (value / 100).toFixed(2) : ''))
  return (
    <Input
      {...props}
      type="text"
      inputMode="decimal"
      value={text}
      onChange={(e) => {
        setText(e.target.value)
        onChange(parseMoneyToMinor(e.target.value) ?? Number.NaN)
      }}
      onBlur={(e) => {
        const minor = parseMoneyToMinor(text)
        if (minor !== null) setText((minor / 100).toFixed(2))
        props.onBlur?.(e)
      }}
    />
  )
}
