import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link } from 'react-router-dom'
import { PLAN_STATUS_LABEL, type PlanDetail } from '#shared/schemas/plan.ts'
import { paths } from '#src/app/paths.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { ErrorState } from '#src/components/ui/states.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useApprovePlan } from '../api/approve-plan.ts'
import { useAssignPlan } from '../api/assign-plan.ts'
import { useEmailSheet } from '../api/email-sheet.ts'
import { planQueries } from '../api/plan-queries.ts'

function ProblemText({ error }: { error: unknown }) {
  if (!error) return null
  if (error instanceof ApiError) {
    return (
      <div role="alert" className="rounded-card border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
        <p className="font-semibold">{error.body.detail}</p>
        {(error.body.errors ?? []).map((e, i) => (
          <p key={i} className="text-xs">
            {e.message}
          </p>
        ))}
        {error.status === 409 && <p className="mt-1 text-xs">Reload the page to see the current plan.</p>}
      </div>
    )
  }
  return <ErrorState error={error} />
}

/** Status and approval: approve is disabled while a blocking finding stands, and says why next to the button. */
export function ApprovePanel({ plan }: { plan: PlanDetail }) {
  const approve = useApprovePlan(plan.id)
  const state = plan.status === 'approved' ? 'clear' : plan.status === 'superseded' || plan.blocking ? 'blocked' : 'caution'
  return (
    <div className="space-y-3 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <SafetyBadge state={state} label={PLAN_STATUS_LABEL[plan.status]} />
        <span className="text-ink-600">version {plan.planVersion}</span>
      </div>
      <dl className="grid grid-cols-[7rem_1fr] gap-x-2 gap-y-1">
        <dt className="text-ink-600">Computed</dt>
        <dd>
          {new Date(plan.createdAt).toLocaleString()} {plan.createdBy ? `by ${plan.createdBy}` : ''}
        </dd>
        {plan.approvedAt && (
          <>
            <dt className="text-ink-600">Approved</dt>
            <dd>
              {new Date(plan.approvedAt).toLocaleString()} {plan.approvedBy ? `by ${plan.approvedBy}` : ''}
            </dd>
          </>
        )}
      </dl>
      {plan.status === 'draft' && (
        <>
          <Button
            size="lg"
            className="w-full"
            disabled={plan.blocking || approve.isPending}
            aria-describedby={plan.blocking ? `block-reason-${plan.id}` : undefined}
            onClick={() => approve.mutate(plan.version)}
          >
            {approve.isPending ? 'Approving…' : 'Approve for filling'}
          </Button>
          {plan.blocking && (
            <p id={`block-reason-${plan.id}`} className="flex flex-wrap items-start gap-2 text-sm text-blocked-fg">
              <SafetyBadge state="blocked" />
              <span className="min-w-0 flex-1">Cannot be approved: {plan.blockingReason}</span>
            </p>
          )}
        </>
      )}
      {plan.status === 'superseded' && <p className="text-sm text-ink-700">A newer version replaces this plan. Open the current one from the plan list.</p>}
      <ProblemText error={approve.error} />
      <Link className="inline-block text-sm font-semibold text-copper-700 underline" to={paths.plans.new.href(plan.orderLineId, plan.id)}>
        Re-plan as a new version
      </Link>
    </div>
  )
}

/** Fill sheet on paper (A4 or US Letter) and by e-mail to a technician. */
export function SheetPanel({ plan }: { plan: PlanDetail }) {
  const technicians = useQuery(planQueries.technicians())
  const email = useEmailSheet(plan.id)
  const [techId, setTechId] = useState<number | ''>(plan.assignedTechnicianId ?? '')
  return (
    <div className="space-y-3 text-sm">
      <div className="flex flex-wrap gap-2">
        <a
          className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 font-medium text-ink-800 hover:bg-ink-100"
          href={`/api/plans/${plan.id}/fill-sheet.pdf`}
          target="_blank"
          rel="noreferrer"
        >
          Fill sheet (A4, PDF)
        </a>
        <a
          className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 font-medium text-ink-800 hover:bg-ink-100"
          href={`/api/plans/${plan.id}/fill-sheet.pdf?size=LETTER`}
          target="_blank"
          rel="noreferrer"
        >
          US Letter
        </a>
      </div>
      {plan.status !== 'approved' && <p className="text-xs text-ink-700">The sheet is marked “do not fill” until the plan is approved.</p>}
      <div className="flex flex-wrap items-end gap-2">
        <Field label="E-mail the sheet to" className="min-w-0 flex-1">
          {(id) => (
            <Select id={id} value={techId} onChange={(e) => setTechId(e.target.value ? Number(e.target.value) : '')}>
              <option value="">Choose a technician…</option>
              {(technicians.data ?? []).map((t) => (
                <option key={t.id} value={t.id}>
                  {t.name}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Button variant="secondary" disabled={techId === '' || email.isPending} onClick={() => techId !== '' && email.mutate(techId)}>
          {email.isPending ? 'Sending…' : 'Send'}
        </Button>
      </div>
      {email.isSuccess && (
        <p role="status" className="text-sm text-clear-fg">
          Sent to {email.data.sentTo}.
        </p>
      )}
      <ProblemText error={email.error} />
    </div>
  )
}

/** Book cylinders and a technician for an approved plan. */
export function AssignPanel({ plan }: { plan: PlanDetail }) {
  const technicians = useQuery(planQueries.technicians())
  const cylinders = useQuery({ ...planQueries.freeCylinders(plan.line.waterVolumeL), enabled: plan.status === 'approved' })
  const assign = useAssignPlan(plan.id)
  const [techId, setTechId] = useState<number | ''>(plan.assignedTechnicianId ?? '')
  const [date, setDate] = useState(new Date().toISOString().slice(0, 10))
  const [chosen, setChosen] = useState<number[]>([])
  const booked = plan.runs.length
  const left = Math.max(0, plan.line.quantity - booked)
  if (plan.status !== 'approved') return <p className="text-sm text-ink-700">Cylinders and a technician are booked once the plan is approved.</p>
  return (
    <div className="space-y-3 text-sm">
      <p>
        {booked} of {plan.line.quantity} cylinders booked; {left} to go.
      </p>
      {plan.runs.length > 0 && (
        <ul className="space-y-1" aria-label="Booked fills">
          {plan.runs.map((r) => (
            <li key={r.id} className="num">
              {r.cylinderSerial} · {r.scheduledFor} · {r.status}
            </li>
          ))}
        </ul>
      )}
      {left > 0 && (
        <>
          <fieldset className="min-w-0">
            <legend className="text-sm font-medium text-ink-800">Free {plan.line.waterVolumeL} L cylinders</legend>
            {cylinders.isLoading && <p className="text-xs text-ink-600">Loading…</p>}
            {cylinders.isError && <ErrorState error={cylinders.error} retry={() => cylinders.refetch()} />}
            <div className="mt-1 max-h-48 space-y-1 overflow-y-auto">
              {(cylinders.data ?? []).map((c) => (
                <label key={c.id} className="flex min-h-8 items-center gap-2">
                  <input
                    type="checkbox"
                    className="size-4"
                    checked={chosen.includes(c.id)}
                    disabled={!chosen.includes(c.id) && chosen.length >= left}
                    onChange={(e) => setChosen(e.target.checked ? [...chosen, c.id] : chosen.filter((x) => x !== c.id))}
                  />
                  <span className="num">
                    {c.serial} · {c.servicePressureBar} bar{c.oxygenClean ? ' · O2-clean' : ''} ·{' '}
                    {c.residual.kind === 'evacuated' ? 'evacuated' : `${c.residual.pressureBarGauge} bar g left`}
                  </span>
                </label>
              ))}
              {cylinders.data?.length === 0 && <p className="text-xs text-ink-600">No free cylinder of this size. Free one in the cylinder inventory first.</p>}
            </div>
          </fieldset>
          <div className="grid grid-cols-2 gap-2">
            <Field label="Technician">
              {(id) => (
                <Select id={id} value={techId} onChange={(e) => setTechId(e.target.value ? Number(e.target.value) : '')}>
                  <option value="">Choose…</option>
                  {(technicians.data ?? []).map((t) => (
                    <option key={t.id} value={t.id}>
                      {t.name}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
            <Field label="Fill on">{(id) => <Input id={id} type="date" value={date} onChange={(e) => setDate(e.target.value)} />}</Field>
          </div>
          <Button
            className="w-full"
            disabled={chosen.length === 0 || techId === '' || assign.isPending}
            onClick={() =>
              techId !== '' && assign.mutate({ cylinderIds: chosen, technicianId: techId, scheduledFor: date }, { onSuccess: () => setChosen([]) })
            }
          >
            {assign.isPending ? 'Booking…' : `Book ${chosen.length || ''} cylinder${chosen.length === 1 ? '' : 's'}`}
          </Button>
          <ProblemText error={assign.error} />
        </>
      )}
    </div>
  )
}
