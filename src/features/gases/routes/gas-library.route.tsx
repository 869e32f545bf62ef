import { useSuspenseQuery } from '@tanstack/react-query'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import { Suspense, useDeferredValue, useMemo, useState } from 'react'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { Field, Input } from '#src/components/ui/field.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { cn } from '#src/lib/cn.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { gasQueries } from '../api/gas-queries.ts'
import { GasDetail } from '../components/gas-detail.tsx'

export async function loader() {
  // start the request without blocking navigation; the page shows skeleton rows meanwhile
  void queryClient.prefetchQuery(gasQueries.list())
  return null
}

function matches(haystack: string[], needle: string): boolean {
  const n = needle.trim().toLowerCase()
  if (!n) return true
  return haystack.some((h) => h.toLowerCase().includes(n))
}

function Library() {
  const { data } = useSuspenseQuery(gasQueries.list())
  const [search, setSearch] = useState('')
  const deferred = useDeferredValue(search)
  const [selectedId, setSelectedId] = useState<string>(data.items[0]?.id ?? '')
  const visible = useMemo(() => data.items.filter((g) => matches([g.id, g.name, g.formula, g.casNumber, ...g.hazards], deferred)), [data.items, deferred])
  const selected = data.items.find((g) => g.id === selectedId) ?? visible[0]
  return (
    <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <Card title={`${visible.length} of ${data.items.length} gases`}>
        <Field label="Search by name, formula, CAS number or hazard" className="mb-3">
          {(id) => <Input id={id} type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="e.g. CO2, flammable, 7440-37-1" />}
        </Field>
        {visible.length === 0 ? (
          <EmptyState title="No gas matches">Try the formula (CH4), part of the name (meth) or a hazard word (toxic).</EmptyState>
        ) : (
          <ScrollRegion label="Gas table">
            <table className="w-full text-sm">
              <caption className="sr-only">Gas library; choose a gas to see all its data and sources</caption>
              <thead>
                <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                  <th scope="col" className="py-2 pr-2">
                    Gas
                  </th>
                  <th scope="col" className="py-2 pr-2 text-right">
                    M, g/mol
                  </th>
                  <th scope="col" className="py-2 pr-2 text-right">
                    Tc, K
                  </th>
                  <th scope="col" className="py-2 pr-2 text-right">
                    pc, MPa
                  </th>
                  <th scope="col" className="py-2 pr-2 text-right">
                    ω
                  </th>
                  <th scope="col" className="py-2 pr-2">
                    Hazards
                  </th>
                  <th scope="col" className="py-2">
                    GERG-2008
                  </th>
                </tr>
              </thead>
              <tbody>
                {visible.map((g) => (
                  <tr key={g.id} className={cn('border-b border-ink-100', selected?.id === g.id && 'bg-copper-50')}>
                    <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                      <button
                        type="button"
                        className="flex items-center gap-2 text-left hover:underline"
                        aria-pressed={selected?.id === g.id}
                        onClick={() => setSelectedId(g.id)}
                      >
                        <GasChip formula={g.formula} />
                        <span>{g.name}</span>
                      </button>
                    </th>
                    <td className="num py-1.5 pr-2 text-right">{g.molarMass.value}</td>
                    <td className="num py-1.5 pr-2 text-right">{g.criticalTemperature.value}</td>
                    <td className="num py-1.5 pr-2 text-right">{g.criticalPressure.value.toFixed(3)}</td>
                    <td className="num py-1.5 pr-2 text-right">{g.acentricFactor}</td>
                    <td className="py-1.5 pr-2 text-xs text-ink-700">{g.hazards.join(', ') || '—'}</td>
                    <td className="py-1.5 text-xs">{g.models.includes('gerg-2008') ? 'covered' : 'cubic only'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollRegion>
        )}
        <p className="mt-3 text-xs text-ink-600">Molar masses: {data.atomicWeights}.</p>
      </Card>
      <Card title="Data and sources">
        {selected ? <GasDetail gas={selected} /> : <EmptyState title="Choose a gas">Its data and sources appear here.</EmptyState>}
      </Card>
    </div>
  )
}

export function Component() {
  return (
    <div>
      <PageHeader title="Gas library" subtitle="Every gas Fillwright blends, with its properties and where each value comes from." />
      <Suspense fallback={<SkeletonRows rows={10} />}>
        <Library />
      </Suspense>
    </div>
  )
}

export function ErrorBoundary() {
  return (
    <ErrorState error={new Error('The gas library could not be loaded. Check your connection and reload the page.')} retry={() => window.location.reload()} />
  )
}
