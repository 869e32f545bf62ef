import { createColumnHelper, rowSortingFeature, type SortingState, tableFeatures, type Updater, useTable } from '@tanstack/react-table'
import { type KeyboardEvent, useMemo } from 'react'
import { Link } from 'react-router-dom'
import type { OrderSort, OrderSummary } from '#shared/schemas/order.ts'
import { formatMoney } from '#shared/schemas/pricing.ts'
import { paths } from '#src/app/paths.ts'
import { formatDate } from '#src/components/order/format.ts'
import { OrderStatusBadge } from '#src/components/order/status-badge.tsx'
import { SortableThead } from '#src/components/ui/sortable-thead.tsx'
import { cn } from '#src/lib/cn.ts'

const features = tableFeatures({ rowSortingFeature })
const helper = createColumnHelper<typeof features, OrderSummary>()

/** Column ids that sort on the server carry the sort name of GET /api/orders. */
const columns = helper.columns([
  helper.accessor('number', {
    id: 'number',
    header: 'Order',
    cell: (info) => (
      <Link
        data-row-link
        to={paths.orders.detail.href(info.row.original.id)}
        className="font-mono text-xs font-semibold text-ink-900 underline-offset-2 hover:underline"
      >
        {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor((r) => r.customer.company, {
    id: 'customer',
    header: 'Customer',
    enableSorting: false,
    cell: (info) => (
      <span title={info.row.original.customer.company}>
        <span className="mr-1.5 font-mono text-[11px] text-ink-600">{info.row.original.customer.code}</span>
        {info.getValue()}
      </span>
    ),
  }),
  helper.accessor('reference', {
    id: 'reference',
    header: 'Reference',
    enableSorting: false,
    cell: (info) => info.getValue() || <span className="text-ink-400">—</span>,
  }),
  helper.accessor('lineSummary', { id: 'mixture', header: 'Mixture', enableSorting: false }),
  helper.accessor('cylinders', { id: 'cylinders', header: 'Cyl.', enableSorting: false, meta: { numeric: true } }),
  helper.accessor('neededBy', { id: 'neededBy', header: 'Needed by', cell: (info) => formatDate(info.getValue()) }),
  helper.accessor('status', { id: 'status', header: 'Status', enableSorting: false, cell: (info) => <OrderStatusBadge status={info.getValue()} /> }),
  helper.accessor('totalMinor', {
    id: 'total',
    header: 'Total',
    meta: { numeric: true },
    cell: (info) => formatMoney(info.getValue(), info.row.original.currency),
  }),
  helper.accessor('createdAt', { id: 'created', header: 'Entered', cell: (info) => formatDate(info.getValue()) }),
])

export function sortToState(sort: OrderSort): SortingState {
  const desc = sort.startsWith('-')
  return [{ id: desc ? sort.slice(1) : sort, desc }]
}

export function stateToSort(state: SortingState): OrderSort {
  const s = state[0] ?? { id: 'created', desc: true }
  return `${s.desc ? '-' : ''}${s.id}` as OrderSort
}

/** Moves focus between the rows' order links with the arrow keys (Enter opens the order). */
function onGridKeyDown(e: KeyboardEvent<HTMLTableSectionElement>) {
  if (!['ArrowDown', 'ArrowUp', 'Home', 'End'].includes(e.key)) return
  const links = Array.from(e.currentTarget.querySelectorAll<HTMLAnchorElement>('a[data-row-link]'))
  if (links.length === 0) return
  const i = links.indexOf(document.activeElement as HTMLAnchorElement)
  const next =
    e.key === 'Home' ? 0 : e.key === 'End' ? links.length - 1 : e.key === 'ArrowDown' ? Math.min(links.length - 1, i + 1) : Math.max(0, i < 0 ? 0 : i - 1)
  e.preventDefault()
  links[next]?.focus()
}

/**
 * The dense orders table: rows come sorted and filtered from the server (manual sorting); clicking a sortable
 * header asks the server for that order.
 */
export function OrdersTable({
  rows,
  sort,
  onSortChange,
  busy,
}: {
  rows: OrderSummary[]
  sort: OrderSort
  onSortChange: (sort: OrderSort) => void
  busy: boolean
}) {
  const sorting = useMemo(() => sortToState(sort), [sort])
  const table = useTable({
    features,
    columns,
    data: rows,
    getRowId: (r) => String(r.id),
    manualSorting: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    sortDescFirst: true,
    state: { sorting },
    onSortingChange: (updater: Updater<SortingState>) => onSortChange(stateToSort(typeof updater === 'function' ? updater(sorting) : updater)),
  })
  return (
    <div className="overflow-x-auto">
      <table className={cn('w-full text-sm', busy && 'opacity-60')} aria-busy={busy}>
        <caption className="sr-only">Orders; sortable columns have a button in their header. Arrow keys move between orders, Enter opens one.</caption>
        <SortableThead table={table} />
        <tbody onKeyDown={onGridKeyDown}>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-ink-100 focus-within:bg-copper-50 hover:bg-ink-50">
              {row.getAllCells().map((cell) => {
                const numeric = (cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric
                return (
                  <td key={cell.id} className={cn('max-w-72 truncate px-2 py-1', numeric && 'num text-right')}>
                    <table.FlexRender cell={cell} />
                  </td>
                )
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}
