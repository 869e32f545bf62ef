import type { ComponentType } from 'react'
import { cn } from '#src/lib/cn.ts'

/** The part of a TanStack Table (v9) instance the header needs; kept structural so any row type fits. */
interface HeaderTable {
  getHeaderGroups(): { id: string; headers: any[] }[]
  FlexRender: ComponentType<{ header: any }>
}

/**
 * The header row of a dense, server-sorted table: `aria-sort` on each column, a button (with an arrow that
 * says the direction) on sortable columns, right-aligned numeric columns (`meta: { numeric: true }`).
 */
export function SortableThead({ table }: { table: HeaderTable }) {
  return (
    <thead>
      {table.getHeaderGroups().map((group) => (
        <tr key={group.id} className="border-b border-ink-300 text-left text-xs uppercase tracking-wide text-ink-600">
          {group.headers.map((header) => {
            const numeric = (header.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric
            const sorted = header.column.getIsSorted() as false | 'asc' | 'desc'
            return (
              <th
                key={header.id}
                scope="col"
                aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                className={cn('whitespace-nowrap px-2 py-1.5 font-semibold', numeric && 'text-right')}
              >
                {header.column.getCanSort() ? (
                  <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase hover:text-ink-900">
                    <table.FlexRender header={header} />
                    <span aria-hidden="true" className="text-[10px]">
                      {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                    </span>
                  </button>
                ) : (
                  <table.FlexRender header={header} />
                )}
              </th>
            )
          })}
        </tr>
      ))}
    </thead>
  )
}
