import type { TimelineEvent } from '#shared/schemas/order.ts'
import { formatDateTime } from './format.ts'

/** The order's history from the audit trail, oldest first. */
export function OrderTimeline({ events }: { events: TimelineEvent[] }) {
  if (events.length === 0) return <p className="text-sm text-ink-600">No history recorded yet.</p>
  return (
    <ol className="relative space-y-3 border-l-2 border-ink-200 pl-4">
      {events.map((e, i) => (
        <li key={`${e.at}-${i}`} className="relative">
          <span aria-hidden="true" className="absolute -left-[1.4rem] top-1 size-2.5 rounded-full border-2 border-white bg-ink-600" />
          <p className="text-sm font-medium text-ink-900">{e.text}</p>
          <p className="text-xs text-ink-600">
            <time dateTime={e.at}>{formatDateTime(e.at)}</time>
            {e.actor ? ` · ${e.actor}` : ''}
          </p>
        </li>
      ))}
    </ol>
  )
}
