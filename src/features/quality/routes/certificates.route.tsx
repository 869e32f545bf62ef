import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { useSearchParams } from 'react-router-dom'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { COMPOSITION_UNIT_LABEL } from '#shared/schemas/quality.ts'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { qualityQueries } from '../api/quality-queries.ts'
import { CertificateTable } from '../components/certificate-table.tsx'
import { CorrectionForm } from '../components/correction-form.tsx'

export async function loader() {
  void queryClient.prefetchQuery(qualityQueries.certificateList({}))
  return null
}

function CertificatePanel({ id, canCorrect, onSelect }: { id: number; canCorrect: boolean; onSelect: (id: number) => void }) {
  const q = useQuery(qualityQueries.certificate(id))
  const [correcting, setCorrecting] = useState(false)
  if (q.isPending) return <SkeletonRows rows={5} />
  if (q.isError) return <ErrorState error={q.error} retry={() => q.refetch()} />
  const c = q.data
  return (
    <div className="space-y-4 text-sm">
      <dl className="grid grid-cols-[9rem_1fr] gap-x-3 gap-y-1">
        <dt className="text-ink-600">Customer</dt>
        <dd>{c.customerCompany}</dd>
        <dt className="text-ink-600">Cylinder</dt>
        <dd className="font-mono">{c.cylinderSerial}</dd>
        <dt className="text-ink-600">Signed by</dt>
        <dd>{c.signatoryName}</dd>
        <dt className="text-ink-600">Valid until</dt>
        <dd className="num">{c.validUntil}</dd>
      </dl>
      <ul className="space-y-0.5">
        {c.content.composition.map((r) => (
          <li key={r.gas} className="num">
            {r.formula}: {r.valueText} ± {r.uncertaintyText} {COMPOSITION_UNIT_LABEL[r.unit]} (k = {r.coverageFactor})
          </li>
        ))}
        <li>{c.content.balanceGas.formula}: balance</li>
      </ul>
      <div>
        <h3 className="font-semibold">Revisions</h3>
        <ol className="mt-1 space-y-0.5">
          {c.revisions.map((r) => (
            <li key={r.id}>
              <button type="button" className="inline-flex min-h-6 min-w-6 items-center px-1 underline" onClick={() => onSelect(r.id)}>
                rev. {r.revision}
              </button>{' '}
              of {r.releasedAt.slice(0, 10)} {r.current ? '(current)' : `(superseded by rev. ${r.supersededByRevision})`}
              {r.correctionReason ? ` — ${r.correctionReason}` : ''}
            </li>
          ))}
        </ol>
      </div>
      {canCorrect &&
        (correcting ? (
          <CorrectionForm
            certificate={c}
            onDone={(newId) => {
              setCorrecting(false)
              onSelect(newId)
            }}
          />
        ) : (
          c.current && (
            <button type="button" className="font-semibold text-copper-700 underline" onClick={() => setCorrecting(true)}>
              Correct this certificate (new revision)
            </button>
          )
        ))}
    </div>
  )
}

/** Every certificate the shop released, with revisions; QA corrects by issuing the next revision. */
export function Component() {
  const me = useQuery(authQueries.me()).data as SessionUser
  const [params, setParams] = useSearchParams()
  const [currentOnly, setCurrentOnly] = useState(false)
  const list = useQuery(qualityQueries.certificateList(currentOnly ? { current: 'true' } : {}))
  const selected = Number(params.get('id')) || null
  const select = (id: number) => setParams({ id: String(id) }, { replace: true })
  return (
    <div>
      <PageHeader title="Certificates" subtitle="Released certificates of composition. A released revision never changes: a correction is the next revision." />
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card
          title="Released certificates"
          actions={
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={currentOnly} onChange={(e) => setCurrentOnly(e.target.checked)} /> Current revisions only
            </label>
          }
        >
          {list.isPending ? (
            <SkeletonRows rows={6} />
          ) : list.isError ? (
            <ErrorState error={list.error} retry={() => list.refetch()} />
          ) : list.data.length === 0 ? (
            <EmptyState title="No certificates yet">Certificates appear here when QA signs the release of an analysed cylinder.</EmptyState>
          ) : (
            <CertificateTable certificates={list.data} showCustomer selectedId={selected} onSelect={(c) => select(c.id)} />
          )}
        </Card>
        <Card title="Certificate">
          {selected ? (
            <CertificatePanel key={selected} id={selected} canCorrect={me.roles.includes('qa')} onSelect={select} />
          ) : (
            <EmptyState title="Choose a certificate">
              Pick one in the list to see its values and revisions{me.roles.includes('qa') ? ', or to correct it' : ''}.
            </EmptyState>
          )}
        </Card>
      </div>
    </div>
  )
}
