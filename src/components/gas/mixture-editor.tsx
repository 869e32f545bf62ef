import { useId } from 'react'
import { GASES } from '#shared/physics/index.ts'
import { Button } from '#src/components/ui/button.tsx'
import { inputClass } from '#src/components/ui/field.tsx'
import { cn } from '#src/lib/cn.ts'
import { fmt } from '#src/lib/format.ts'
import { GasChip } from './gas-chip.tsx'

/** One row as typed: the amount stays text until it parses, so nothing typed is lost. */
export interface MixtureRowDraft {
  gas: string
  amount: string
  unit: 'percent' | 'ppm'
}

export interface ParsedMixture {
  gasIds: string[]
  x: number[]
  /** per-row messages (row index → message) */
  rowErrors: Record<number, string>
  /** message about the whole mixture (sum) */
  error: string | null
}

const GAS_BY_ID = new Map(GASES.map((g) => [g.id, g]))

/** Turns the typed rows into mole fractions and says what is wrong, row by row. */
export function parseMixture(rows: MixtureRowDraft[]): ParsedMixture {
  const rowErrors: Record<number, string> = {}
  const gasIds: string[] = []
  const x: number[] = []
  const seen = new Set<string>()
  rows.forEach((r, i) => {
    if (!GAS_BY_ID.has(r.gas)) rowErrors[i] = 'Choose a gas'
    else if (seen.has(r.gas)) rowErrors[i] = 'Listed twice: combine the amounts'
    const n = Number(r.amount.replace(',', '.'))
    if (r.amount.trim() === '' || !Number.isFinite(n)) rowErrors[i] ??= 'Enter a number'
    else if (n < 0) rowErrors[i] ??= 'Cannot be negative'
    seen.add(r.gas)
    gasIds.push(r.gas)
    x.push(r.unit === 'ppm' ? n / 1e6 : n / 100)
  })
  const sum = x.reduce((a, b) => a + (Number.isFinite(b) ? b : 0), 0)
  const error = rows.length === 0 ? 'Add at least one gas' : Math.abs(sum - 1) > 1e-6 ? `The amounts add up to ${fmt(sum * 100, 4)} %, not 100 %` : null
  return { gasIds, x, rowErrors, error }
}

/** Sets the last row to whatever the other rows leave (the balance gas). */
export function balanceLastRow(rows: MixtureRowDraft[]): MixtureRowDraft[] {
  if (rows.length === 0) return rows
  const others = rows.slice(0, -1).reduce((s, r) => {
    const n = Number(r.amount.replace(',', '.'))
    return s + (Number.isFinite(n) ? (r.unit === 'ppm' ? n / 1e4 : n) : 0)
  }, 0)
  const last = rows[rows.length - 1]
  const pct = 100 - others
  return [...rows.slice(0, -1), { ...last, unit: 'percent', amount: String(Number(pct.toFixed(8))) }]
}

/**
 * Mixture rows: a gas picker (formula chip beside it), an amount in mol % or ppm (amount fractions), and a
 * "balance" action that fills the last row with the rest.
 */
export function MixtureEditor({
  rows,
  onChange,
  errors,
  sumError,
  allowedGasIds,
  label = 'Mixture (amount fractions)',
}: {
  rows: MixtureRowDraft[]
  onChange: (rows: MixtureRowDraft[]) => void
  errors?: Record<number, string>
  sumError?: string | null
  allowedGasIds?: readonly string[]
  label?: string
}) {
  const baseId = useId()
  const options = allowedGasIds ? GASES.filter((g) => allowedGasIds.includes(g.id)) : GASES
  const set = (i: number, patch: Partial<MixtureRowDraft>) => onChange(rows.map((r, k) => (k === i ? { ...r, ...patch } : r)))
  return (
    <fieldset className="min-w-0 space-y-2">
      <legend className="text-sm font-medium text-ink-800">{label}</legend>
      {rows.map((r, i) => {
        const gas = GAS_BY_ID.get(r.gas)
        const err = errors?.[i]
        return (
          <div key={i} className="flex flex-wrap items-start gap-2">
            <div className="flex min-w-[13rem] flex-1 items-center gap-2">
              <span className="w-14 shrink-0 text-center">
                {gas ? <GasChip formula={gas.formula} name={gas.name} /> : <span className="text-xs text-ink-500">—</span>}
              </span>
              <label className="sr-only" htmlFor={`${baseId}-gas-${i}`}>
                Gas {i + 1}
              </label>
              <select
                id={`${baseId}-gas-${i}`}
                className={cn(inputClass, 'min-w-0 flex-1')}
                value={r.gas}
                onChange={(e) => set(i, { gas: e.target.value })}
                aria-invalid={!!err}
                aria-describedby={err ? `${baseId}-err-${i}` : undefined}
              >
                <option value="">Choose a gas…</option>
                {options.map((g) => (
                  <option key={g.id} value={g.id}>
                    {g.formula} — {g.name}
                  </option>
                ))}
              </select>
            </div>
            <label className="sr-only" htmlFor={`${baseId}-amt-${i}`}>
              Amount of gas {i + 1}
            </label>
            <input
              id={`${baseId}-amt-${i}`}
              className={cn(inputClass, 'num w-28 text-right')}
              inputMode="decimal"
              value={r.amount}
              onChange={(e) => set(i, { amount: e.target.value })}
              aria-invalid={!!err}
              aria-describedby={err ? `${baseId}-err-${i}` : undefined}
            />
            <label className="sr-only" htmlFor={`${baseId}-unit-${i}`}>
              Unit of gas {i + 1}
            </label>
            <select
              id={`${baseId}-unit-${i}`}
              className={cn(inputClass, 'w-24')}
              value={r.unit}
              onChange={(e) => set(i, { unit: e.target.value as MixtureRowDraft['unit'] })}
            >
              <option value="percent">mol %</option>
              <option value="ppm">ppm mol</option>
            </select>
            <Button
              variant="ghost"
              size="sm"
              className="min-h-10"
              aria-label={`Remove gas ${i + 1}`}
              disabled={rows.length <= 1}
              onClick={() => onChange(rows.filter((_, k) => k !== i))}
            >
              Remove
            </Button>
            {err && (
              <p id={`${baseId}-err-${i}`} role="alert" className="w-full pl-16 text-xs font-medium text-blocked-fg">
                {err}
              </p>
            )}
          </div>
        )
      })}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" size="sm" onClick={() => onChange([...rows, { gas: '', amount: '0', unit: 'percent' }])}>
          Add gas
        </Button>
        <Button variant="secondary" size="sm" onClick={() => onChange(balanceLastRow(rows))}>
          Last gas makes up the balance
        </Button>
      </div>
      {sumError && (
        <p role="alert" className="text-xs font-medium text-blocked-fg">
          {sumError}
        </p>
      )}
    </fieldset>
  )
}
