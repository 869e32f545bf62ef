import { useQuery } from '@tanstack/react-query'
import { useDeferredValue, useMemo, useState } from 'react'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import type { Cylinder } from '#shared/schemas/cylinder.ts'
import type { FillPlanRequest } from '#shared/schemas/fill-plan.ts'
import { type PlanCylinderRef, type PlanDetail, type PlanLineSpec, type PlanOptionsParsed, PlanSetupError, planRequestFromLine } from '#shared/schemas/plan.ts'
import { paths } from '#src/app/paths.ts'
import { MixtureEditor, type MixtureRowDraft, parseMixture } from '#src/components/gas/mixture-editor.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, Select } from '#src/components/ui/field.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useCreatePlan } from '../api/create-plan.ts'
import { planQueries } from '../api/plan-queries.ts'
import { CylinderSummary, SpecPanel } from '../components/spec-panel.tsx'
import { PlanOptionsForm } from '../components/plan-options-form.tsx'
import { PlanWorkspace } from '../components/plan-workspace.tsx'
import { toPlanCylinder } from '../lib/cylinder-ref.ts'
import { defaultOptionsDraft, draftFromOptions, type OptionsDraft, optionsFromDraft } from '../lib/options-draft.ts'
import { previewComparison, previewPlan } from '../lib/preview.ts'

function todayIso() {
  return new Date().toISOString().slice(0, 10)
}

type Built = { request: FillPlanRequest; error: null } | { request: null; error: string }

function buildRequest(line: PlanLineSpec, cylinder: PlanCylinderRef | null, options: PlanOptionsParsed | null): Built {
  if (!options) return { request: null, error: 'Fix the highlighted options.' }
  try {
    return { request: planRequestFromLine(line, cylinder, options, todayIso()), error: null }
  } catch (err) {
    return { request: null, error: err instanceof PlanSetupError ? err.message : String(err) }
  }
}

/** Preview of the plan and of every model's plan, recomputed in the browser as the options change. */
function usePreview(request: FillPlanRequest | null) {
  const deferred = useDeferredValue(request)
  const plan = useMemo(() => (deferred ? previewPlan(deferred) : null), [deferred])
  const comparison = useMemo(() => (deferred && plan?.ok ? previewComparison(deferred) : null), [deferred, plan])
  return { plan, comparison, stale: deferred !== request, request: deferred }
}

function PreviewOrError({
  built,
  preview,
  left,
  line,
  banner,
}: {
  built: Built
  preview: ReturnType<typeof usePreview>
  left: React.ReactNode
  line: PlanLineSpec | null
  banner?: React.ReactNode
}) {
  const balanceGas = line?.balanceGas ?? built.request?.target.find((t) => t.balance)?.gas ?? null
  if (built.error || !preview.plan || !preview.request) {
    return (
      <div className="grid gap-5 lg:grid-cols-[24rem_minmax(0,1fr)]">
        <div className="space-y-5">{left}</div>
        <Card title="Plan preview">
          <EmptyState title="No plan yet">{built.error ?? 'The plan appears here as soon as the options are complete.'}</EmptyState>
        </Card>
      </div>
    )
  }
  if (!preview.plan.ok) {
    const e = preview.plan.error
    return (
      <div className="grid gap-5 lg:grid-cols-[24rem_minmax(0,1fr)]">
        <div className="space-y-5">{left}</div>
        <Card title="Plan preview">
          <div role="alert" className="flex flex-wrap items-start gap-2 text-sm">
            <SafetyBadge state="blocked" label={e.status === 422 ? 'Cannot be reached' : 'Invalid input'} />
            <span className="min-w-0 flex-1">
              {e.message}
              {e.field && <span className="block text-xs text-ink-600">About: {e.field}</span>}
              <span className="mt-1 block text-xs text-ink-700">Change the sources, the cylinder or the options, then the plan is recomputed.</span>
            </span>
          </div>
        </Card>
      </div>
    )
  }
  return (
    <PlanWorkspace
      left={left}
      plan={preview.plan.plan}
      request={preview.request}
      line={line}
      comparison={preview.comparison}
      balanceGas={balanceGas}
      banner={banner}
    />
  )
}

function LineWorkspace({ line, from }: { line: PlanLineSpec; from: PlanDetail | null }) {
  const { units } = useDisplayUnits()
  const navigate = useNavigate()
  const create = useCreatePlan()
  const cylinders = useQuery(planQueries.freeCylinders(line.waterVolumeL))
  const [cylinderId, setCylinderId] = useState<number | null>(from?.cylinder?.id ?? null)
  const [draft, setDraft] = useState<OptionsDraft>(() =>
    from
      ? draftFromOptions(from.options, line.components, line.balanceGas, line.method)
      : defaultOptionsDraft(line.components, line.balanceGas, line.method, units.temperature === 'degF' ? 'F' : 'C'),
  )
  const cylinderList: Cylinder[] = cylinders.data ?? []
  const chosen = cylinderList.find((c) => c.id === cylinderId) ?? null
  const cylinderRef = chosen ? toPlanCylinder(chosen) : cylinderId && from?.cylinder?.id === cylinderId ? from.cylinder : null
  const { options, errors } = useMemo(() => optionsFromDraft(draft, line.balanceGas, units.pressure), [draft, line.balanceGas, units.pressure])
  const built = useMemo(() => buildRequest(line, cylinderRef, options), [line, cylinderRef, options])
  const preview = usePreview(built.request)
  const serverError = create.error instanceof ApiError ? create.error : null

  const save = () => {
    if (!options) return
    create.mutate({ orderLineId: line.id, cylinderId, options }, { onSuccess: (plan) => navigate(paths.plans.detail.href(plan.id)) })
  }

  const left = (
    <>
      <Card title="Specification">
        <SpecPanel line={line} />
      </Card>
      <Card title="Cylinder">
        <div className="space-y-3">
          <Field
            label="Cylinder from the inventory"
            hint={cylinders.isLoading ? 'Loading free cylinders…' : `${cylinderList.length} free ${line.waterVolumeL} L cylinders`}
          >
            {(id, d) => (
              <Select id={id} aria-describedby={d} value={cylinderId ?? ''} onChange={(e) => setCylinderId(e.target.value ? Number(e.target.value) : null)}>
                <option value="">None yet: plan for {line.waterVolumeL} L, evacuated</option>
                {cylinderList.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.serial} · {c.servicePressureBar} bar · {c.oxygenClean ? 'O2-clean · ' : ''}
                    {c.residual.kind === 'evacuated' ? 'evacuated' : `${c.residual.pressureBarGauge} bar g left`} · test due {c.nextTestDate}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          {cylinders.isError && <ErrorState error={cylinders.error} retry={() => cylinders.refetch()} />}
          <CylinderSummary cylinder={cylinderRef} />
        </div>
      </Card>
      <Card title="How to make it">
        <PlanOptionsForm draft={draft} onChange={setDraft} errors={errors} balanceGas={line.balanceGas} />
      </Card>
      <Card>
        <div className="space-y-2">
          <Button size="lg" className="w-full" disabled={!options || create.isPending} onClick={save}>
            {create.isPending ? 'Computing on the server…' : from ? `Save as version ${from.planVersion + 1}` : 'Save plan for approval'}
          </Button>
          <p className="text-xs text-ink-600">
            The server recomputes the plan from the specification and these options; the preview here is for checking as you go.
          </p>
          {serverError && (
            <div role="alert" className="rounded-card border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
              <p className="font-semibold">Not saved: {serverError.body.detail}</p>
              {(serverError.body.errors ?? []).map((e) => (
                <p key={e.field} className="text-xs">
                  {e.field}: {e.message}
                </p>
              ))}
            </div>
          )}
          {create.error && !serverError && <ErrorState error={create.error} />}
        </div>
      </Card>
    </>
  )
  return <PreviewOrError built={built} preview={preview} left={left} line={line} />
}

const AD_HOC_ORDER = { id: 0, number: 'ad hoc', status: 'accepted' as const, customer: 'no order', neededBy: null }

function AdHocWorkspace() {
  const { units } = useDisplayUnits()
  const [rows, setRows] = useState<MixtureRowDraft[]>([
    { gas: 'carbon-dioxide', amount: '18', unit: 'percent' },
    { gas: 'argon', amount: '82', unit: 'percent' },
  ])
  const [pressure, setPressure] = useState('200')
  const [volume, setVolume] = useState('50')
  const [service, setService] = useState('200')
  const [tolerance, setTolerance] = useState('10')
  const [oxygenClean, setOxygenClean] = useState(false)
  const parsed = parseMixture(rows)
  const balanceGas = rows[rows.length - 1]?.gas ?? ''
  const mixtureOk = !parsed.error && Object.keys(parsed.rowErrors).length === 0
  const line: PlanLineSpec | null = mixtureOk
    ? {
        id: 0,
        lineNo: 1,
        description: 'Ad-hoc mixture',
        components: parsed.gasIds.map((gas, i) => ({ gas, fraction: parsed.x[i] })),
        balanceGas,
        blendTolerancePct: Number(tolerance) || 10,
        certificationUncertaintyPct: 0,
        waterVolumeL: Number(volume) || 0,
        valveOutlet: '',
        quantity: 1,
        finalPressureBarGauge: Number(pressure) || 0,
        method: 'partial-pressure',
        order: AD_HOC_ORDER,
      }
    : null
  const components = line?.components ?? [{ gas: balanceGas }]
  const sourceKey = parsed.gasIds.join('|')
  const [draftState, setDraft] = useState<{ key: string; draft: OptionsDraft }>(() => ({
    key: sourceKey,
    draft: defaultOptionsDraft(components, balanceGas, 'partial-pressure', units.temperature === 'degF' ? 'F' : 'C'),
  }))
  // a changed gas list resets the parent-gas choices
  const draft =
    draftState.key === sourceKey
      ? draftState.draft
      : { ...draftState.draft, sources: defaultOptionsDraft(components, balanceGas, draftState.draft.method, draftState.draft.temperatureUnit).sources }
  const { options, errors } = useMemo(() => optionsFromDraft(draft, balanceGas, units.pressure), [draft, balanceGas, units.pressure])
  const numbersOk = Number(pressure) > 0 && Number(volume) > 0 && Number(service) > 0 && Number(tolerance) > 0
  const withCylinder: PlanOptionsParsed | null =
    options && line
      ? {
          ...options,
          cylinder: {
            waterVolume: { value: Number(volume), unit: 'L' },
            servicePressure: { value: Number(service), unit: 'bar', reference: 'gauge' },
            oxygenClean,
            residual: { kind: 'evacuated' },
          },
        }
      : null
  const built: Built =
    line && numbersOk
      ? buildRequest(line, null, withCylinder)
      : {
          request: null,
          error: mixtureOk
            ? 'Enter positive numbers for pressure, volume, service pressure and tolerance.'
            : 'Complete the mixture: the amounts must add up to 100 %.',
        }
  const preview = usePreview(built.request)

  const left = (
    <>
      <Card title="Mixture">
        <div className="space-y-3">
          <MixtureEditor
            rows={rows}
            onChange={setRows}
            errors={parsed.rowErrors}
            sumError={parsed.error}
            label="Target composition (last row is the balance gas)"
          />
          <Field label="Fill pressure, bar gauge settled at 15 °C">
            {(id) => <Input id={id} className="num" inputMode="decimal" value={pressure} onChange={(e) => setPressure(e.target.value)} />}
          </Field>
          <Field label="Blend tolerance, ± % relative">
            {(id) => <Input id={id} className="num" inputMode="decimal" value={tolerance} onChange={(e) => setTolerance(e.target.value)} />}
          </Field>
        </div>
      </Card>
      <Card title="Cylinder">
        <div className="space-y-3">
          <Field label="Water volume, L">
            {(id) => <Input id={id} className="num" inputMode="decimal" value={volume} onChange={(e) => setVolume(e.target.value)} />}
          </Field>
          <Field label="Service pressure, bar gauge">
            {(id) => <Input id={id} className="num" inputMode="decimal" value={service} onChange={(e) => setService(e.target.value)} />}
          </Field>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" className="size-4" checked={oxygenClean} onChange={(e) => setOxygenClean(e.target.checked)} />
            Cylinder, valve and manifold are oxygen-clean
          </label>
        </div>
      </Card>
      <Card title="How to make it">
        <PlanOptionsForm draft={draft} onChange={(d) => setDraft({ key: sourceKey, draft: d })} errors={errors} balanceGas={balanceGas} />
      </Card>
    </>
  )
  const banner = (
    <p className="rounded-card border border-ink-200 bg-white px-3 py-2 text-sm text-ink-700">
      Ad-hoc plan: computed here and not stored. To save, approve and print a plan, open an order line from the{' '}
      <Link className="font-semibold text-copper-700 underline" to={paths.plans.list.href()}>
        planning queue
      </Link>
      .
    </p>
  )
  return <PreviewOrError built={built} preview={preview} left={left} line={line} banner={banner} />
}

export function Component() {
  const [params] = useSearchParams()
  const orderLineId = Number(params.get('orderLineId')) || null
  const fromId = Number(params.get('from')) || null
  const line = useQuery({ ...planQueries.lineSpec(orderLineId ?? 0), enabled: orderLineId !== null })
  const from = useQuery({ ...planQueries.detail(fromId ?? 0), enabled: fromId !== null })
  if (!orderLineId) {
    return (
      <div>
        <PageHeader title="Ad-hoc fill plan" subtitle="Plan any mixture without an order. Computed in your browser as you type." />
        <AdHocWorkspace />
      </div>
    )
  }
  return (
    <div>
      <PageHeader
        title={from.data ? `Re-plan: new version of plan ${from.data.planVersion}` : 'New fill plan'}
        subtitle={
          line.data ? `${line.data.order.number} line ${line.data.lineNo} · ${line.data.description} · ${line.data.order.customer}` : 'Loading the order line…'
        }
      />
      {line.isLoading || (fromId !== null && from.isLoading) ? (
        <SkeletonRows rows={8} />
      ) : line.isError ? (
        <ErrorState error={line.error} retry={() => line.refetch()} />
      ) : line.data ? (
        <LineWorkspace key={`${line.data.id}-${fromId ?? 0}`} line={line.data} from={from.data ?? null} />
      ) : null}
    </div>
  )
}
