import { useSuspenseQuery } from '@tanstack/react-query'
import { Suspense, useDeferredValue, useMemo } from 'react'
import { type LoaderFunctionArgs, useParams } from 'react-router-dom'
import { Card, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { planQueries } from '../api/plan-queries.ts'
import { ApprovePanel, AssignPanel, SheetPanel } from '../components/plan-actions.tsx'
import { PlanWorkspace } from '../components/plan-workspace.tsx'
import { CylinderSummary, SpecPanel } from '../components/spec-panel.tsx'
import { previewComparison } from '../lib/preview.ts'

export async function loader({ params }: LoaderFunctionArgs) {
  const id = Number(params.id)
  if (Number.isInteger(id) && id > 0) void queryClient.prefetchQuery(planQueries.detail(id))
  return null
}

function Detail({ id }: { id: number }) {
  const { data: plan } = useSuspenseQuery(planQueries.detail(id))
  // the model comparison is computed in the browser from the stored request
  const request = useDeferredValue(plan.request)
  const comparison = useMemo(() => previewComparison(request), [request])
  const left = (
    <>
      <Card title="Approval">
        <ApprovePanel plan={plan} />
      </Card>
      <Card title="Specification">
        <SpecPanel line={plan.line} />
      </Card>
      <Card title="Cylinder">
        <CylinderSummary cylinder={plan.cylinder} />
      </Card>
      <Card title="Fill sheet">
        <SheetPanel plan={plan} />
      </Card>
      <Card title="Cylinders and technician">
        <AssignPanel plan={plan} />
      </Card>
    </>
  )
  return (
    <div>
      <PageHeader
        title={`Fill plan ${plan.orderNumber} · line ${plan.lineNo} · v${plan.planVersion}`}
        subtitle={`${plan.lineDescription} · ${plan.customer}`}
      />
      <PlanWorkspace left={left} plan={plan.result} request={plan.request} line={plan.line} comparison={comparison} balanceGas={plan.line.balanceGas} />
    </div>
  )
}

export function Component() {
  const params = useParams()
  const id = Number(params.id)
  if (!Number.isInteger(id) || id <= 0) return <ErrorState error={new Error('This address does not name a fill plan.')} />
  return (
    <Suspense fallback={<SkeletonRows rows={10} />}>
      <Detail id={id} />
    </Suspense>
  )
}
