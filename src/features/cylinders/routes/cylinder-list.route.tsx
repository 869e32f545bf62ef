import { keepPreviousData, useQuery } from '@tanstack/react-query'
import { useEffect, useState } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { CYLINDER_MATERIALS, CYLINDER_SORTS, CYLINDER_STATUS_LABEL, CYLINDER_STATUSES } from '#shared/schemas/cylinder.ts'
import { paths } from '#src/app/paths.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { type CylinderFilters, cylinderQueries } from '../api/cylinder-queries.ts'
import { type CylinderSort, CylinderTable } from '../components/cylinder-table.tsx'

const PAGE_SIZE = 100

function filtersFrom(params: URLSearchParams): CylinderFilters {
  const pick = <T extends string>(key: string, allowed: readonly T[]) => {
    const v = params.get(key)
    return v && (allowed as readonly string[]).includes(v) ? (v as T) : undefined
  }
  const offset = Number(params.get('offset'))
  return {
    q: params.get('q') ?? undefined,
    status: pick('status', CYLINDER_STATUSES),
    material: pick('material', CYLINDER_MATERIALS),
    oxygenClean: pick('oxygenClean', ['true', 'false'] as const),
    test: pick('test', ['overdue', 'due-soon'] as const),
    sort: pick('sort', CYLINDER_SORTS) ?? 'serial',
    dir: pick('dir', ['asc', 'desc'] as const) ?? 'asc',
    limit: PAGE_SIZE,
    offset: Number.isInteger(offset) && offset > 0 ? offset : 0,
  }
}

export async function loader({ request }: { request: Request }) {
  void queryClient.prefetchQuery(cylinderQueries.list(filtersFrom(new URL(request.url).searchParams)))
  return null
}

export function Component() {
  const [params, setParams] = useSearchParams()
  const filters = filtersFrom(params)
  const list = useQuery({ ...cylinderQueries.list(filters), placeholderData: keepPreviousData })
  const me = useQuery(authQueries.me()).data as SessionUser | null | undefined
  const keeper = !!me?.roles.some((r) => r === 'admin' || r === 'blender' || r === 'sales')
  const [search, setSearch] = useState(filters.q ?? '')

  const setFilter = (patch: Record<string, string | undefined>) => {
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev)
        for (const [k, v] of Object.entries(patch)) {
          if (v === undefined || v === '') next.delete(k)
          else next.set(k, v)
        }
        if (!('offset' in patch)) next.delete('offset')
        return next
      },
      { replace: true },
    )
  }

  // search as you type, a moment after the last key
  const q = filters.q ?? ''
  useEffect(() => {
    const trimmed = search.trim()
    if (trimmed === q) return
    const timer = setTimeout(() => setFilter({ q: trimmed || undefined }), 250)
    return () => clearTimeout(timer)
  })

  const total = list.data?.total ?? 0
  const offset = filters.offset ?? 0
  return (
    <div>
      <PageHeader
        title="Cylinders"
        subtitle="Every cylinder the shop fills: marked pressures, periodic test dates, and where each one is in the work."
        actions={
          keeper ? (
            <>
              <Link
                to={paths.cylinders.import.href()}
                className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
              >
                Import CSV
              </Link>
              <Link
                to={paths.cylinders.new.href()}
                className="inline-flex min-h-10 items-center rounded-md bg-copper-600 px-4 text-sm font-medium text-white hover:bg-copper-700"
              >
                Add cylinder
              </Link>
            </>
          ) : undefined
        }
      />
      <Card>
        <div className="mb-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
          <Field label="Search" hint="Serial, barcode, valve outlet or owner">
            {(id, d) => (
              <Input id={id} aria-describedby={d} type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="e.g. KR-S50" />
            )}
          </Field>
          <Field label="Periodic test">
            {(id) => (
              <Select id={id} value={filters.test ?? ''} onChange={(e) => setFilter({ test: e.target.value || undefined })}>
                <option value="">Any</option>
                <option value="overdue">Overdue (blocked)</option>
                <option value="due-soon">Due within 90 days</option>
              </Select>
            )}
          </Field>
          <Field label="State">
            {(id) => (
              <Select id={id} value={filters.status ?? ''} onChange={(e) => setFilter({ status: e.target.value || undefined })}>
                <option value="">Any</option>
                {CYLINDER_STATUSES.map((s) => (
                  <option key={s} value={s}>
                    {CYLINDER_STATUS_LABEL[s]}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          <Field label="Material">
            {(id) => (
              <Select id={id} value={filters.material ?? ''} onChange={(e) => setFilter({ material: e.target.value || undefined })}>
                <option value="">Any</option>
                {CYLINDER_MATERIALS.map((m) => (
                  <option key={m} value={m}>
                    {m}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          <Field label="Oxygen-clean">
            {(id) => (
              <Select id={id} value={filters.oxygenClean ?? ''} onChange={(e) => setFilter({ oxygenClean: e.target.value || undefined })}>
                <option value="">Any</option>
                <option value="true">Yes</option>
                <option value="false">No</option>
              </Select>
            )}
          </Field>
        </div>
        {list.isPending ? (
          <SkeletonRows rows={8} />
        ) : list.isError ? (
          <ErrorState error={list.error} retry={() => void list.refetch()} />
        ) : list.data.items.length === 0 ? (
          <EmptyState title="No cylinders match">
            {params.toString() ? 'Clear a filter or the search to see more.' : 'Add cylinders one by one or import a CSV file of your inventory.'}
          </EmptyState>
        ) : (
          <>
            <CylinderTable
              rows={list.data.items}
              sort={{ sort: filters.sort ?? 'serial', dir: filters.dir ?? 'asc' }}
              onSortChange={(s: CylinderSort) => setFilter({ sort: s.sort, dir: s.dir })}
              busy={list.isFetching}
            />
            <div className="mt-3 flex items-center justify-between text-sm text-ink-600">
              <span className="num">
                {offset + 1}–{offset + list.data.items.length} of {total}
              </span>
              <div className="flex gap-2">
                <Button variant="secondary" disabled={offset === 0} onClick={() => setFilter({ offset: String(Math.max(0, offset - PAGE_SIZE)) })}>
                  Previous
                </Button>
                <Button variant="secondary" disabled={offset + PAGE_SIZE >= total} onClick={() => setFilter({ offset: String(offset + PAGE_SIZE) })}>
                  Next
                </Button>
              </div>
            </div>
          </>
        )}
      </Card>
    </div>
  )
}
