import { ORDER_STATUS_LABEL, type OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { cn } from '#src/lib/cn.ts'

/**
 * Order status as a word with a small shape: hollow ring while the shop waits on someone, half ring in production,
 * full disc when done, a dash when cancelled. Status is never shown by colour alone, and the safety colours are
 * not used for it.
 */
const STYLE: Record<OrderStatus, { cls: string; shape: 'ring' | 'half' | 'disc' | 'dash' }> = {
  draft: { cls: 'border-ink-300 bg-white text-ink-800', shape: 'ring' },
  quoted: { cls: 'border-copper-300 bg-copper-50 text-copper-800', shape: 'ring' },
  accepted: { cls: 'border-copper-400 bg-copper-100 text-copper-900', shape: 'half' },
  planned: { cls: 'border-ink-300 bg-ink-100 text-ink-900', shape: 'half' },
  filling: { cls: 'border-ink-400 bg-ink-100 text-ink-900', shape: 'half' },
  analysis: { cls: 'border-ink-400 bg-ink-100 text-ink-900', shape: 'half' },
  released: { cls: 'border-ink-700 bg-ink-800 text-white', shape: 'disc' },
  shipped: { cls: 'border-ink-700 bg-ink-700 text-white', shape: 'disc' },
  invoiced: { cls: 'border-ink-300 bg-ink-50 text-ink-800', shape: 'disc' },
  paid: { cls: 'border-ink-200 bg-ink-50 text-ink-600', shape: 'disc' },
  cancelled: { cls: 'border-ink-200 bg-white text-ink-500 line-through decoration-1', shape: 'dash' },
}

function Shape({ shape }: { shape: 'ring' | 'half' | 'disc' | 'dash' }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 12 12" className="size-2.5 shrink-0">
      {shape === 'ring' && <circle cx="6" cy="6" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.6" />}
      {shape === 'half' && (
        <>
          <circle cx="6" cy="6" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.6" />
          <path d="M6 1.5a4.5 4.5 0 0 1 0 9z" fill="currentColor" />
        </>
      )}
      {shape === 'disc' && <circle cx="6" cy="6" r="5" fill="currentColor" />}
      {shape === 'dash' && <path d="M2 6h8" stroke="currentColor" strokeWidth="1.8" />}
    </svg>
  )
}

export function OrderStatusBadge({ status, className }: { status: OrderStatus; className?: string }) {
  const s = STYLE[status]
  return (
    <span className={cn('inline-flex items-center gap-1.5 whitespace-nowrap rounded border px-1.5 py-0.5 text-xs font-semibold', s.cls, className)}>
      <Shape shape={s.shape} />
      {ORDER_STATUS_LABEL[status]}
    </span>
  )
}
