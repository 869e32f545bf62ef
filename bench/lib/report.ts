/**
 * Collects the named figures of one bench run, the budgets they are judged against, and prints them as a table
 * or as one flat JSON object (a key per figure, the unit in the key's name).
 */

export type FigureValue = number | string | boolean | null

interface Row {
  section: string
  key: string
  label: string
  value: FigureValue
}

export interface Budget {
  key: string
  label: string
  /** the figure the budget is judged on */
  figure: string
  limit: number
  /** 'max': figure ≤ limit; 'min': figure ≥ limit; 'below': figure < limit */
  kind: 'max' | 'min' | 'below'
}

export interface BudgetResult extends Budget {
  value: number | null
  met: boolean | null
}

export class Report {
  private readonly rows: Row[] = []
  private readonly figures = new Map<string, FigureValue>()
  private readonly budgets: Budget[] = []
  readonly notes: string[] = []

  add(section: string, key: string, value: FigureValue, label: string): void {
    if (this.figures.has(key)) throw new Error(`figure ${key} reported twice`)
    this.figures.set(key, value)
    this.rows.push({ section, key, label, value })
  }

  get(key: string): FigureValue | undefined {
    return this.figures.get(key)
  }

  budget(b: Budget): void {
    this.budgets.push(b)
  }

  note(text: string): void {
    this.notes.push(text)
  }

  budgetResults(): BudgetResult[] {
    return this.budgets.map((b) => {
      const v = this.figures.get(b.figure)
      if (typeof v !== 'number' || !Number.isFinite(v)) return { ...b, value: null, met: null }
      const met = b.kind === 'max' ? v <= b.limit : b.kind === 'min' ? v >= b.limit : v < b.limit
      return { ...b, value: v, met }
    })
  }

  toJson(): Record<string, FigureValue> {
    const out: Record<string, FigureValue> = Object.fromEntries(this.figures)
    for (const r of this.budgetResults()) out[`budget_${r.key}_met`] = r.met
    return out
  }

  toTable(): string {
    const lines: string[] = []
    let section = ''
    const keyWidth = Math.max(...this.rows.map((r) => r.key.length), 10)
    for (const r of this.rows) {
      if (r.section !== section) {
        section = r.section
        lines.push('', `== ${section} ${'='.repeat(Math.max(0, 100 - section.length))}`)
      }
      lines.push(`  ${r.key.padEnd(keyWidth)}  ${formatValue(r.value).padStart(12)}  ${r.label}`)
    }
    lines.push('', `== budgets ${'='.repeat(93)}`)
    for (const b of this.budgetResults()) {
      const op = b.kind === 'max' ? '≤' : b.kind === 'min' ? '≥' : '<'
      const verdict = b.met === null ? 'NOT MEASURED' : b.met ? 'met' : 'MISSED'
      lines.push(`  ${verdict.padEnd(12)} ${b.label}: ${b.value === null ? '—' : formatValue(b.value)} (budget ${op} ${b.limit}; ${b.figure})`)
    }
    if (this.notes.length > 0) {
      lines.push('', `== notes ${'='.repeat(95)}`)
      for (const n of this.notes) lines.push(`  - ${n}`)
    }
    return lines.join('\n')
  }
}

export function formatValue(v: FigureValue): string {
  if (v === null) return '—'
  if (typeof v === 'boolean') return v ? 'yes' : 'no'
  if (typeof v === 'string') return v
  if (Number.isInteger(v)) return String(v)
  const a = Math.abs(v)
  if (a >= 1000) return v.toFixed(0)
  if (a >= 100) return v.toFixed(1)
  if (a >= 1) return v.toFixed(2)
  return v.toFixed(3)
}

/** Round for the JSON output: three significant decimals are plenty for timings. */
export function round(v: number, digits = 3): number {
  const f = 10 ** digits
  return Math.round(v * f) / f
}

/** 100000 → "100k", 1000000 → "1m": the size part of a figure's key. */
export function sizeTag(n: number): string {
  if (n >= 1e6 && n % 1e5 === 0) return `${n / 1e6}m`.replace('.', '_')
  if (n >= 1000 && n % 100 === 0) return `${n / 1000}k`.replace('.', '_')
  return String(n)
}
