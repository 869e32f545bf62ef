import { Fragment } from 'react'
import { cn } from '#src/lib/cn.ts'

/** A chemical formula with its digits set as subscripts (CO2 → CO₂ on screen; the text stays "CO2" for search and copy). */
export function Formula({ formula, className }: { formula: string; className?: string }) {
  const parts = formula.split(/(\d+)/)
  return (
    <span className={className}>
      {parts.map((p, i) =>
        /^\d+$/.test(p) && i > 0 ? (
          <sub key={i} className="text-[0.75em]">
            {p}
          </sub>
        ) : (
          <Fragment key={i}>{p}</Fragment>
        ),
      )}
    </span>
  )
}

/** A gas shown as a chip always carries its formula; the name is there for screen readers and on wide layouts. */
export function GasChip({ formula, name, showName = false, className }: { formula: string; name?: string; showName?: boolean; className?: string }) {
  return (
    <span
      className={cn('inline-flex items-center gap-1 rounded-full border border-ink-300 bg-ink-50 px-2 py-0.5 text-xs font-semibold text-ink-800', className)}
      title={name}
    >
      <Formula formula={formula} />
      {name && (showName ? <span className="font-normal text-ink-600">{name}</span> : <span className="sr-only">({name})</span>)}
    </span>
  )
}
