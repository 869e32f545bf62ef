import { ORDER_STATUS_LABEL, type OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { cn } from '#src/lib/cn.ts'

/** The customer's view of the lifecycle, in five steps. */
const STEPS: { label: string; statuses: OrderStatus[] }[] = [
  { label: 'Quote', statuses: ['draft', 'quoted'] },
  { label: 'Accepted', statuses: ['accepted'] },
  { label: 'In production', statuses: ['planned', 'filling', 'analysis'] },
  { label: 'Certified & shipped', statuses: ['released', 'shipped'] },
  { label: 'Invoice', statuses: ['invoiced', 'paid'] },
]

/** Status at a glance: where the order is, as numbered steps (current one named), readable on a phone. */
export function OrderProgress({ status, className }: { status: OrderStatus; className?: string }) {
  if (status === 'cancelled') return <p className={cn('text-sm font-semibold text-ink-600', className)}>This order was cancelled.</p>
  const current = STEPS.findIndex((s) => s.statuses.includes(status))
  return (
    <ol className={cn('grid grid-cols-5 gap-1', className)} aria-label={`Progress: ${ORDER_STATUS_LABEL[status]}`}>
      {STEPS.map((step, i) => {
        const state = i < current || (i === current && (status === 'paid' || status === 'shipped')) ? 'done' : i === current ? 'current' : 'todo'
        return (
          <li key={step.label} className="flex flex-col gap-1" aria-current={state === 'current' ? 'step' : undefined}>
            <span className={cn('h-1.5 rounded-full', state === 'done' ? 'bg-ink-800' : state === 'current' ? 'bg-copper-500' : 'bg-ink-200')} />
            <span className={cn('text-[11px] leading-tight', state === 'todo' ? 'text-ink-500' : 'font-semibold text-ink-900')}>
              {step.label}
              <span className="sr-only">{state === 'done' ? ' (done)' : state === 'current' ? ' (now)' : ' (to come)'}</span>
            </span>
          </li>
        )
      })}
    </ol>
  )
}
