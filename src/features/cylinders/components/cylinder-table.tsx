import { createColumnHelper, rowSortingFeature, type SortingState, tableFeatures, type Updater, useTable } from '@tanstack/react-table'
import { useMemo } from 'react'
import { Link } from 'react-router-dom'
import type { Cylinder, CYLINDER_SORTS } from '#shared/schemas/cylinder.ts'
import { paths } from '#src/app/paths.ts'
import { SortableThead } from '#src/components/ui/sortable-thead.tsx'
import { cn } from '#src/lib/cn.ts'
import { CylinderStatusText, residualText, UsabilityBadge } from './cylinder-badges.tsx'

type SortKey = (typeof CYLINDER_SORTS)[number]
export interface CylinderSort {
  sort: SortKey
  dir: 'asc' | 'desc'
}

const features = tableFeatures({ rowSortingFeature })
const helper = createColumnHelper<typeof features, Cylinder>()

const columns = helper.columns([
  helper.accessor('serial', {
    id: 'serial',
    header: 'Serial',
    cell: (info) => (
      <Link to={paths.cylinders.detail.href(info.row.original.id)} className="font-mono text-xs font-semibold text-ink-900 underline-offset-2 hover:underline">
        {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor('barcode', {
    id: 'barcode',
    header: 'Barcode',
    enableSorting: false,
    cell: (info) => <span className="font-mono text-xs">{info.getValue()}</span>,
  }),
  helper.accessor('waterVolumeL', { id: 'waterVolumeL', header: 'Water vol.', meta: { numeric: true }, cell: (info) => `${info.getValue()} L` }),
  helper.accessor('servicePressureBar', {
    id: 'service',
    header: 'Service',
    enableSorting: false,
    meta: { numeric: true },
    cell: (info) => `${info.getValue()} bar g`,
  }),
  helper.accessor('testPressureBar', { id: 'test', header: 'Test', enableSorting: false, meta: { numeric: true }, cell: (info) => `${info.getValue()} bar g` }),
  helper.accessor('material', { id: 'material', header: 'Material', enableSorting: false }),
  helper.accessor('valveOutlet', { id: 'valve', header: 'Valve outlet', enableSorting: false }),
  helper.accessor('oxygenClean', { id: 'o2', header: 'O2-clean', enableSorting: false, cell: (info) => (info.getValue() ? 'Yes' : 'No') }),
  helper.accessor('ownerName', {
    id: 'owner',
    header: 'Owner',
    enableSorting: false,
    cell: (info) => info.getValue() ?? <span className="text-ink-600">Shop</span>,
  }),
  helper.accessor('lastTestDate', { id: 'lastTest', header: 'Last test', enableSorting: false, meta: { numeric: true } }),
  helper.accessor('nextTestDate', { id: 'nextTestDate', header: 'Next test', meta: { numeric: true } }),
  helper.display({ id: 'use', header: 'Use', cell: (info) => <UsabilityBadge cylinder={info.row.original} /> }),
  helper.accessor('status', { id: 'status', header: 'State', cell: (info) => <CylinderStatusText status={info.getValue()} /> }),
  helper.accessor((c) => residualText(c), { id: 'residual', header: 'Contents left', enableSorting: false }),
])

/** The dense inventory table; rows come sorted and filtered from the server. */
export function CylinderTable({
  rows,
  sort,
  onSortChange,
  busy,
}: {
  rows: Cylinder[]
  sort: CylinderSort
  onSortChange: (s: CylinderSort) => void
  busy: boolean
}) {
  const sorting = useMemo<SortingState>(() => [{ id: sort.sort, desc: sort.dir === 'desc' }], [sort])
  const table = useTable({
    features,
    columns,
    data: rows,
    getRowId: (r) => String(r.id),
    manualSorting: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    state: { sorting },
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = (typeof updater === 'function' ? updater(sorting) : updater)[0]
      if (next) onSortChange({ sort: next.id as SortKey, dir: next.desc ? 'desc' : 'asc' })
    },
  })
  return (
    <div className="overflow-x-auto">
      <table className={cn('w-full text-sm', busy && 'opacity-60')} aria-busy={busy}>
        <caption className="sr-only">Cylinder inventory; sortable columns have a button in their header.</caption>
        <SortableThead table={table} />
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className={cn('border-b border-ink-100 focus-within:bg-copper-50 hover:bg-ink-50', row.original.blocked && 'bg-blocked-bg/40')}>
              {row.getAllCells().map((cell) => {
                const numeric = (cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric
                return (
                  <td key={cell.id} className={cn('whitespace-nowrap px-2 py-1', numeric && 'num text-right')}>
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
