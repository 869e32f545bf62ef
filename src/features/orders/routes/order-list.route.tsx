import { keepPreviousData, useQuery } from '@tanstack/react-query'
import { useEffect, useRef, useState } from 'react'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { ORDER_SORTS, type OrderSort } from '#shared/schemas/order.ts'
import { ORDER_STATUS_LABEL, ORDER_STATUSES, type OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { paths } from '#src/app/paths.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { cn } from '#src/lib/cn.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { type OrderFilters, orderQueries } from '../api/order-queries.ts'
import { OrdersTable } from '../components/orders-table.tsx'

const PAGE_SIZE = 50
const OPEN: OrderStatus[] = ORDER_STATUSES.filter((s) => s !== 'paid' && s !== 'cancelled')

function filtersFrom(params: URLSearchParams): Omit<OrderFilters, 'cursor' | 'limit'> {
  const sort = params.get('sort')
  const customerId = Number(params.get('customerId'))
  return {
    status: params.get('status') ?? undefined,
    q: params.get('q') ?? undefined,
    customerId: Number.isInteger(customerId) && customerId > 0 ? customerId : undefined,
    sort: (ORDER_SORTS as readonly string[]).includes(sort ?? '') ? (sort as OrderSort) : '-created',
  }
}

export async function loader({ request }: { request: Request }) {
  const f = filtersFrom(new URL(request.url).searchParams)
  void queryClient.prefetchQuery(orderQueries.list({ ...f, limit: PAGE_SIZE }))
  return null
}

function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null
  return !!el && (el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || el.isContentEditable)
}

export function Component() {
  const [params, setParams] = useSearchParams()
  const navigate = useNavigate()
  const filters = filtersFrom(params)
  const filterKey = JSON.stringify(filters)
  // keyset paging: the cursors of the pages before this one
  const [pages, setPages] = useState<{ key: string; cursors: (string | undefined)[] }>({ key: filterKey, cursors: [undefined] })
  const cursors = pages.key === filterKey ? pages.cursors : [undefined]
  const cursor = cursors[cursors.length - 1]
  const list = useQuery({ ...orderQueries.list({ ...filters, cursor, limit: PAGE_SIZE }), placeholderData: keepPreviousData })
  // the count comes with the first page; later pages reuse it from the cache
  const firstPage = useQuery({ ...orderQueries.list({ ...filters, cursor: undefined, limit: PAGE_SIZE }), enabled: cursors.length > 1 })
  const total = list.data?.total ?? firstPage.data?.total ?? null
  const me = useQuery(authQueries.me()).data as SessionUser | null | undefined
  const salesDesk = !!me?.roles.some((r) => r === 'sales' || r === 'admin')
  const customers = useQuery({ ...orderQueries.customers(), enabled: salesDesk })
  const searchRef = useRef<HTMLInputElement>(null)
  const [search, setSearch] = useState(filters.q ?? '')

  const setFilter = (patch: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params)
    for (const [k, v] of Object.entries(patch)) {
      if (v === undefined || v === '') next.delete(k)
      else next.set(k, v)
    }
    setParams(next, { replace: true })
  }

  // search as you type, a moment after the last key
  const qParam = filters.q ?? ''
  useEffect(() => {
    const trimmed = search.trim()
    if (trimmed === qParam) return
    const t = setTimeout(() => {
      setParams(
        (prev) => {
          const next = new URLSearchParams(prev)
          if (trimmed) next.set('q', trimmed)
          else next.delete('q')
          return next
        },
        { replace: true },
      )
    }, 250)
    return () => clearTimeout(t)
  }, [search, qParam, setParams])

  const nextPage = () => {
    if (list.data?.nextCursor) setPages({ key: filterKey, cursors: [...cursors, list.data.nextCursor] })
  }
  const prevPage = () => {
    if (cursors.length > 1) setPages({ key: filterKey, cursors: cursors.slice(0, -1) })
  }
  const pageKeys = useRef({ nextPage, prevPage })
  pageKeys.current = { nextPage, prevPage }

  useEffect(() => {
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey || isTyping(e.target)) return
      if (e.key === '/') {
        e.preventDefault()
        searchRef.current?.focus()
      } else if (e.key === 'n' && salesDesk) {
        e.preventDefault()
        navigate(paths.orders.new.href())
      } else if (e.key === ']') pageKeys.current.nextPage()
      else if (e.key === '[') pageKeys.current.prevPage()
    }
    window.addEventListener('keydown', onKey)
    return () => window.removeEventListener('keydown', onKey)
  }, [navigate, salesDesk])

  const selected = new Set((filters.status ?? '').split(',').filter(Boolean) as OrderStatus[])
  const toggleStatus = (s: OrderStatus) => {
    const next = new Set(selected)
    if (next.has(s)) next.delete(s)
    else next.add(s)
    setFilter({ status: [...next].join(',') || undefined })
  }
  const isOpenPreset = selected.size === OPEN.length && OPEN.every((s) => selected.has(s))
  const firstRow = (cursors.length - 1) * PAGE_SIZE + 1
  const items = list.data?.items ?? []

  return (
    <div>
      <PageHeader
        title="Orders"
        subtitle="Every specification, quote and order. Filter, sort and open one; the price and status come from the server."
        actions={
          salesDesk && (
            <Link
              to={paths.orders.new.href()}
              className="inline-flex min-h-10 items-center rounded-md bg-copper-600 px-4 text-sm font-medium text-white hover:bg-copper-700"
            >
              New specification
            </Link>
          )
        }
      />
      <Card>
        <div className="mb-3 flex flex-wrap items-end gap-3">
          <Field label="Search number, company or reference" className="min-w-64 flex-1">
            {(id) => (
              <Input
                ref={searchRef}
                id={id}
                type="search"
                value={search}
                onChange={(e) => setSearch(e.target.value)}
                placeholder="e.g. FW-2026-00012, Brightwater, PO 4471"
              />
            )}
          </Field>
          {salesDesk && (
            <Field label="Customer" className="w-64">
              {(id) => (
                <Select id={id} value={filters.customerId ?? ''} onChange={(e) => setFilter({ customerId: e.target.value || undefined })}>
                  <option value="">All customers</option>
                  {customers.data?.items.map((c) => (
                    <option key={c.id} value={c.id}>
                      {c.code} — {c.company}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          )}
        </div>
        <fieldset className="mb-3">
          <legend className="mb-1 text-sm font-medium text-ink-800">Status</legend>
          <div className="flex flex-wrap gap-1.5">
            <button
              type="button"
              aria-pressed={selected.size === 0}
              onClick={() => setFilter({ status: undefined })}
              className={cn(
                'rounded-full border px-2.5 py-1 text-xs font-medium',
                selected.size === 0 ? 'border-ink-800 bg-ink-800 text-white' : 'border-ink-300 bg-white text-ink-800 hover:bg-ink-100',
              )}
            >
              All
            </button>
            <button
              type="button"
              aria-pressed={isOpenPreset}
              onClick={() => setFilter({ status: isOpenPreset ? undefined : OPEN.join(',') })}
              className={cn(
                'rounded-full border px-2.5 py-1 text-xs font-medium',
                isOpenPreset ? 'border-ink-800 bg-ink-800 text-white' : 'border-ink-300 bg-white text-ink-800 hover:bg-ink-100',
              )}
            >
              Open
            </button>
            <span aria-hidden="true" className="mx-1 border-l border-ink-200" />
            {ORDER_STATUSES.map((s) => (
              <button
                key={s}
                type="button"
                aria-pressed={selected.has(s)}
                onClick={() => toggleStatus(s)}
                className={cn(
                  'rounded-full border px-2.5 py-1 text-xs font-medium',
                  selected.has(s) ? 'border-copper-600 bg-copper-600 text-white' : 'border-ink-300 bg-white text-ink-800 hover:bg-ink-100',
                )}
              >
                {ORDER_STATUS_LABEL[s]}
              </button>
            ))}
          </div>
        </fieldset>

        {list.isPending ? (
          <SkeletonRows rows={12} />
        ) : list.isError ? (
          <ErrorState error={list.error} retry={() => list.refetch()} />
        ) : items.length === 0 ? (
          <EmptyState
            title={filters.q || filters.status || filters.customerId ? 'No order matches these filters' : 'No orders yet'}
            action={
              filters.q || filters.status || filters.customerId ? (
                <Button
                  variant="secondary"
                  onClick={() => {
                    setSearch('')
                    setParams(new URLSearchParams(), { replace: true })
                  }}
                >
                  Clear filters
                </Button>
              ) : undefined
            }
          >
            {filters.q || filters.status || filters.customerId
              ? 'Change the search or the status buttons to see more.'
              : 'Specifications entered on the sales desk appear here, from draft to paid.'}
          </EmptyState>
        ) : (
          <>
            <OrdersTable
              rows={items}
              sort={filters.sort ?? '-created'}
              onSortChange={(sort) => setFilter({ sort: sort === '-created' ? undefined : sort })}
              busy={list.isFetching}
            />
            <div className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm">
              <p className="num text-ink-700" aria-live="polite">
                {firstRow}–{firstRow + items.length - 1}
                {total !== null ? ` of ${total.toLocaleString('en-GB')}` : ''}
              </p>
              <div className="flex gap-2">
                <Button variant="secondary" size="sm" onClick={prevPage} disabled={cursors.length <= 1}>
                  Previous page
                </Button>
                <Button variant="secondary" size="sm" onClick={nextPage} disabled={!list.data?.nextCursor}>
                  Next page
                </Button>
              </div>
            </div>
          </>
        )}
        <p className="mt-3 text-xs text-ink-500">
          Keys: <kbd>/</kbd> search · <kbd>↑</kbd> <kbd>↓</kbd> move between orders · <kbd>Enter</kbd> open · <kbd>[</kbd> <kbd>]</kbd> previous/next page
          {salesDesk ? (
            <>
              {' '}
              · <kbd>N</kbd> new specification
            </>
          ) : null}
        </p>
      </Card>
    </div>
  )
}

export function ErrorBoundary() {
  return <ErrorState error={new Error('The orders could not be loaded. Check your connection and reload the page.')} retry={() => window.location.reload()} />
}
