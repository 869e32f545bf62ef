import { INVOICE_STATUS_LABEL, type InvoiceStatus } from '#shared/schemas/billing.ts'
import { cn } from '#src/lib/cn.ts'

const STYLE: Record<InvoiceStatus, string> = {
  draft: 'border-ink-300 bg-ink-50 text-ink-700',
  open: 'border-copper-300 bg-copper-50 text-copper-800',
  paid: 'border-clear-border bg-clear-bg text-clear-fg',
  void: 'border-ink-300 bg-ink-100 text-ink-700',
  uncollectible: 'border-blocked-border bg-blocked-bg text-blocked-fg',
}
const MARK: Record<InvoiceStatus, string> = { draft: '…', open: '○', paid: '●', void: '–', uncollectible: '!' }

/** An invoice's status as a word with a mark, never colour alone. */
export function InvoiceStatusPill({ status }: { status: InvoiceStatus }) {
  return (
    <span className={cn('inline-flex items-center gap-1 rounded border px-2 py-0.5 text-xs font-semibold', STYLE[status])}>
      <span aria-hidden="true">{MARK[status]}</span>
      {INVOICE_STATUS_LABEL[status]}
    </span>
  )
}
