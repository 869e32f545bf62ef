import { useQuery } from '@tanstack/react-query'
import { GASES } from '#shared/physics/index.ts'
import {
  HAZARD_LABEL,
  type HazardSurchargeKey,
  PRICE_KIND_LABEL,
  PRICE_KINDS,
  PRICE_VOLUME_REFERENCE_LABEL,
  type PriceEntry,
  type PriceKind,
} from '#shared/schemas/pricing.ts'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { priceQueries } from '../api/price-queries.ts'
import { AddPriceForm } from '../components/add-price-form.tsx'
import { PriceRow } from '../components/price-row.tsx'

export async function loader() {
  void queryClient.prefetchQuery(priceQueries.book())
  return null
}

const SECTION_NOTE: Record<PriceKind, string> = {
  gas: `Parent gas used per cylinder: per standard cubic metre at ${PRICE_VOLUME_REFERENCE_LABEL} (real gas), or per kg.`,
  rental: 'Per cylinder per day; a cylinder is charged at the smallest class that holds its water volume.',
  certification: 'Per cylinder; a line is charged at the loosest class that still meets the uncertainty asked for (k = 2).',
  surcharge: 'Per cylinder, from the classification of the finished mixture (transport divisions 2.1 and 2.3, oxidising 5.1) or a toxic/corrosive component.',
}

function keyLabel(e: PriceEntry): string {
  switch (e.kind) {
    case 'gas': {
      const g = GASES.find((x) => x.id === e.key)
      if (e.key === 'air') return 'Air (synthetic, N2/O2/Ar)'
      return g ? `${g.formula} (${g.name})` : e.key
    }
    case 'rental':
      return `up to ${e.key.replace('L', ' L')}`
    case 'certification':
      return `U ${e.key} % rel.`
    case 'surcharge':
      return HAZARD_LABEL[e.key as HazardSurchargeKey]?.split(' (')[0] ?? e.key
  }
}

export function Component() {
  const book = useQuery(priceQueries.book())
  return (
    <div>
      <PageHeader
        title="Price book"
        subtitle={`Prices in ${book.data?.currency ?? 'EUR'}, excluding VAT. Gas per m³ is always at ${PRICE_VOLUME_REFERENCE_LABEL}. Changes apply to quotes priced from now on; sent quotes keep their prices.`}
      />
      {book.isPending ? (
        <SkeletonRows rows={12} />
      ) : book.isError ? (
        <ErrorState error={book.error} retry={() => book.refetch()} />
      ) : (
        <div className="space-y-5">
          {PRICE_KINDS.map((kind) => {
            const entries = book.data.entries.filter((e) => e.kind === kind)
            return (
              <Card key={kind} title={PRICE_KIND_LABEL[kind]}>
                <p className="mb-2 text-sm text-ink-600">{SECTION_NOTE[kind]}</p>
                {entries.length === 0 ? (
                  <EmptyState title={`No ${PRICE_KIND_LABEL[kind].toLowerCase()} yet`}>
                    Quotes that need one cannot be priced until you add it below.
                  </EmptyState>
                ) : (
                  <div className="overflow-x-auto">
                    <table className="w-full text-sm">
                      <caption className="sr-only">{PRICE_KIND_LABEL[kind]}</caption>
                      <thead>
                        <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                          <th scope="col" className="py-2 pr-2">
                            {kind === 'gas' ? 'Gas' : kind === 'rental' ? 'Cylinder' : kind === 'certification' ? 'Class' : 'Hazard'}
                          </th>
                          <th scope="col" className="py-2 pr-2">
                            Label on the quote
                          </th>
                          <th scope="col" className="py-2 pr-2">
                            Unit
                          </th>
                          <th scope="col" className="py-2 pr-2">
                            Price ({book.data.currency})
                          </th>
                          <th scope="col" className="py-2">
                            <span className="sr-only">Actions</span>
                          </th>
                        </tr>
                      </thead>
                      <tbody>
                        {entries.map((e) => (
                          <PriceRow key={`${e.id}-${e.updatedAt}`} entry={e} keyLabel={keyLabel(e)} />
                        ))}
                      </tbody>
                    </table>
                  </div>
                )}
                <AddPriceForm kind={kind} taken={new Set(entries.map((e) => e.key))} />
              </Card>
            )
          })}
        </div>
      )}
    </div>
  )
}

export function ErrorBoundary() {
  return (
    <ErrorState error={new Error('The price book could not be loaded. Check your connection and reload the page.')} retry={() => window.location.reload()} />
  )
}
