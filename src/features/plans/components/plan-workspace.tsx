import { lazy, type ReactNode, Suspense } from 'react'
import type { FillPlanRequest, FillPlanResponse } from '#shared/schemas/fill-plan.ts'
import { MODEL_LABEL } from '#shared/schemas/gas.ts'
import { standingCautions } from '#shared/schemas/plan-cautions.ts'
import type { PlanLineSpec } from '#shared/schemas/plan.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, Skeleton } from '#src/components/ui/states.tsx'
import type { ComparisonPreview } from '../lib/preview.ts'
import { GeneralFindings, StandingCautions } from './findings.tsx'
import { ModelComparison } from './model-comparison.tsx'
import { Classification, PredictedComposition, PremixProposal, PressureChecks } from './plan-facts.tsx'
import { StepsTable, TemperatureTable } from './steps-table.tsx'

const PressureChart = lazy(() => import('./pressure-chart.tsx'))

/**
 * The blender's workspace: the specification and options on the left, the steps (with their findings) in the
 * middle, the pressure-per-step chart and the model comparison on the right; stacked on narrower screens.
 */
export function PlanWorkspace({
  left,
  plan,
  request,
  line,
  comparison,
  balanceGas,
  banner,
}: {
  left: ReactNode
  plan: FillPlanResponse
  request: FillPlanRequest
  line: PlanLineSpec | null
  comparison: ComparisonPreview | null
  balanceGas: string | null
  banner?: ReactNode
}) {
  const handled = [...request.target, ...plan.steps.flatMap((s) => s.sourceComposition)]
  const blocks = plan.warnings.filter((w) => w.severity === 'block')
  return (
    <div className="grid gap-5 lg:grid-cols-[22rem_minmax(0,1fr)] 2xl:grid-cols-[21rem_minmax(0,1fr)_25rem]">
      <div className="space-y-5">{left}</div>
      {/* below 2xl the middle and right columns stack in one column; at 2xl they are two grid columns */}
      <div className="flex min-w-0 flex-col gap-5 2xl:contents">
        <div className="min-w-0 space-y-5">
          {banner}
          <StandingCautions cautions={standingCautions(handled)} />
          <Card
            title={`Steps · ${MODEL_LABEL[plan.model]} · ${plan.method === 'gravimetric' ? 'gravimetric' : 'partial pressure'}`}
            actions={
              plan.approvable ? (
                <SafetyBadge state="clear" label="No blocking finding" />
              ) : (
                <SafetyBadge state="blocked" label={`${blocks.length} blocking finding${blocks.length === 1 ? '' : 's'}`} />
              )
            }
          >
            <StepsTable plan={plan} request={request} />
            <div className="mt-4">
              <GeneralFindings warnings={plan.warnings} />
            </div>
          </Card>
          <Card title="Targets at other gas temperatures">
            <TemperatureTable plan={plan} request={request} />
          </Card>
          {plan.premixProposal && (
            <Card title="Premix proposal">
              <PremixProposal plan={plan} />
            </Card>
          )}
        </div>
        <div className="min-w-0 space-y-5">
          <Card title="Cumulative pressure per step, every model">
            {comparison?.ok ? (
              <Suspense fallback={<Skeleton className="h-72 w-full" />}>
                <PressureChart comparison={comparison.comparison} selected={plan.model} />
              </Suspense>
            ) : (
              <p className="text-sm text-ink-600">{comparison ? comparison.error.message : 'Computing…'}</p>
            )}
          </Card>
          <Card title="What each model’s plan would really produce">
            {comparison?.ok ? (
              <ModelComparison comparison={comparison.comparison} selected={plan.model} line={line} balanceGas={balanceGas} />
            ) : (
              <p className="text-sm text-ink-600">{comparison ? comparison.error.message : 'Computing…'}</p>
            )}
          </Card>
          <Card title="Planned composition">
            <PredictedComposition plan={plan} line={line} />
          </Card>
          <Card title="Pressure checks and classification">
            <div className="space-y-4">
              <PressureChecks plan={plan} />
              <Classification plan={plan} />
              {plan.assumptions.length > 0 && (
                <details className="text-xs text-ink-700">
                  <summary className="cursor-pointer font-medium">Assumptions of this plan ({plan.assumptions.length})</summary>
                  <ul className="mt-1 list-disc space-y-0.5 pl-5">
                    {plan.assumptions.map((a) => (
                      <li key={a}>{a}</li>
                    ))}
                  </ul>
                </details>
              )}
            </div>
          </Card>
        </div>
      </div>
    </div>
  )
}
