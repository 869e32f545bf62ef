import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { CYLINDER_STATUS_LABEL, type Cylinder } from '#shared/schemas/cylinder.ts'
import { READING_OUTCOME_LABEL, RUN_STATUS_LABEL } from '#shared/schemas/run.ts'
import { paths } from '#src/app/paths.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { ApiError } from '#src/lib/api-client.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { cylinderLabelHref, cylinderQueries } from '../api/cylinder-queries.ts'
import { useUpdateCylinder } from '../api/update-cylinder.ts'
import { residualText, UsabilityBadge } from '../components/cylinder-badges.tsx'
import { CylinderForm } from '../components/cylinder-form.tsx'

export async function loader({ params }: LoaderFunctionArgs) {
  const id = Number(params.id)
  if (Number.isInteger(id) && id > 0) void queryClient.prefetchQuery(cylinderQueries.detail(id))
  return null
}

const fmt = (n: number | null, digits = 2) => (n === null ? '—' : n.toFixed(digits))

function Facts({ c }: { c: Cylinder }) {
  const rows: [string, string][] = [
    ['Barcode', c.barcode],
    ['Water volume', `${c.waterVolumeL} L`],
    ['Service pressure', `${c.servicePressureBar} bar (gauge, at 15 °C)`],
    ['Test pressure', `${c.testPressureBar} bar (gauge)`],
    ['Material / valve outlet', `${c.material} / ${c.valveOutlet}`],
    ['Oxygen-clean', c.oxygenClean ? 'Yes' : 'No'],
    ['Owner', c.ownerName ?? 'The shop'],
    ['Last / next periodic test', `${c.lastTestDate} / ${c.nextTestDate}`],
    ['State', CYLINDER_STATUS_LABEL[c.status]],
    ['Contents left', residualText(c)],
  ]
  return (
    <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
      {rows.map(([k, v]) => (
        <div key={k} className="flex justify-between gap-3 border-b border-ink-100 py-1">
          <dt className="text-ink-600">{k}</dt>
          <dd className="num text-right font-medium text-ink-900">{v}</dd>
        </div>
      ))}
    </dl>
  )
}

function History({ id }: { id: number }) {
  const history = useQuery(cylinderQueries.history(id))
  if (history.isPending) return <SkeletonRows rows={3} />
  if (history.isError) return <ErrorState error={history.error} retry={() => void history.refetch()} />
  if (history.data.runs.length === 0)
    return <EmptyState title="Never filled here">Each fill run of this cylinder appears here with every reading the technician recorded.</EmptyState>
  return (
    <div className="space-y-4">
      {history.data.runs.map((r) => (
        <section key={r.runId} className="rounded border border-ink-200 p-3">
          <h3 className="flex flex-wrap items-center gap-x-3 text-sm font-semibold text-ink-900">
            <Link to={paths.runs.detail.href(r.runId)} className="underline">
              Fill run {r.runId}
            </Link>
            <span>{r.orderNumber ?? ''}</span>
            <span className="font-normal text-ink-600">{r.description}</span>
            <span className="font-normal text-ink-600">
              {RUN_STATUS_LABEL[r.status]} · {r.scheduledFor} · {r.technician ?? 'unassigned'}
              {r.replanCount > 0 ? ` · re-planned ${r.replanCount}×` : ''}
            </span>
          </h3>
          {r.readings.length === 0 ? (
            <p className="mt-1 text-sm text-ink-600">No readings yet.</p>
          ) : (
            <table className="mt-2 w-full text-sm">
              <caption className="sr-only">Readings of fill run {r.runId}</caption>
              <thead>
                <tr className="text-left text-xs uppercase text-ink-600">
                  <th className="px-1">Step</th>
                  <th className="px-1">Gas</th>
                  <th className="px-1 text-right">Pressure (bar g)</th>
                  <th className="px-1 text-right">Temp. (°C)</th>
                  <th className="px-1 text-right">Scale (kg)</th>
                  <th className="px-1">Outcome</th>
                  <th className="px-1">By, when</th>
                </tr>
              </thead>
              <tbody>
                {r.readings.map((x) => (
                  <tr key={x.id} className="border-t border-ink-100">
                    <td className="num px-1">{x.stepIndex + 1}</td>
                    <td className="px-1">{x.gas}</td>
                    <td className="num px-1 text-right">{fmt(x.pressureBarGauge)}</td>
                    <td className="num px-1 text-right">{fmt(x.temperatureC, 1)}</td>
                    <td className="num px-1 text-right">{fmt(x.scaleKg, 3)}</td>
                    <td className="px-1">
                      <SafetyBadge state={x.outcome === 'on-target' ? 'clear' : 'caution'} label={READING_OUTCOME_LABEL[x.outcome]} />
                    </td>
                    <td className="px-1 text-ink-600">
                      {x.recordedBy ?? '—'}, {new Date(x.recordedAt).toLocaleString()}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
      ))}
    </div>
  )
}

export function Component() {
  const id = Number(useParams().id)
  const cylinder = useQuery(cylinderQueries.detail(id))
  const me = useQuery(authQueries.me()).data as SessionUser | null | undefined
  const keeper = !!me?.roles.some((r) => r === 'admin' || r === 'blender' || r === 'sales')
  const canPrint = keeper || !!me?.roles.includes('technician')
  const [editing, setEditing] = useState(false)
  const update = useUpdateCylinder(id)
  if (cylinder.isPending) return <SkeletonRows rows={8} />
  if (cylinder.isError) return <ErrorState error={cylinder.error} retry={() => void cylinder.refetch()} />
  const c = cylinder.data
  return (
    <div className="max-w-5xl space-y-5">
      <PageHeader
        title={`Cylinder ${c.serial}`}
        subtitle={<UsabilityBadge cylinder={c} />}
        actions={
          <>
            {canPrint && (
              <a
                href={cylinderLabelHref(c.id)}
                target="_blank"
                rel="noreferrer"
                className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
              >
                Print label (PDF)
              </a>
            )}
            {keeper && !editing && (
              <button
                type="button"
                onClick={() => setEditing(true)}
                className="inline-flex min-h-10 items-center rounded-md bg-copper-600 px-4 text-sm font-medium text-white hover:bg-copper-700"
              >
                Edit
              </button>
            )}
          </>
        }
      />
      {c.blocked && (
        <div role="alert" className="flex items-start gap-3 rounded-card border border-blocked-border bg-blocked-bg px-4 py-3 text-blocked-fg">
          <SafetyBadge state="blocked" />
          <p className="text-sm font-medium">{c.blockReason} It cannot be planned or booked for a fill.</p>
        </div>
      )}
      <Card title="Markings and state">
        {editing ? (
          <CylinderForm
            key={c.version}
            cylinder={c}
            pending={update.isPending}
            error={update.error}
            onSubmit={(values, setFieldError) => {
              const { status, ...rest } = values
              const manualState = c.status === 'available' || c.status === 'quarantine' || c.status === 'retired'
              update.mutate(
                { ...rest, ...(manualState ? { status } : {}), expectedVersion: c.version },
                {
                  onSuccess: () => setEditing(false),
                  onError: (err) => {
                    if (err instanceof ApiError) {
                      for (const [f, m] of Object.entries(err.fieldErrors())) setFieldError(f, m)
                      if (err.status === 409) void cylinder.refetch()
                    }
                  },
                },
              )
            }}
          />
        ) : (
          <Facts c={c} />
        )}
        {c.notes && !editing && <p className="mt-3 whitespace-pre-line text-sm text-ink-700">{c.notes}</p>}
      </Card>
      <Card title="Fill history">
        <History id={c.id} />
      </Card>
    </div>
  )
}
