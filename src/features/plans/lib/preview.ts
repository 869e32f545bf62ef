import { compareModelsFromRequest, fillPlanFromRequest } from '#shared/planning/index.ts'
import type { CompareModelsResponse, FillPlanRequest, FillPlanResponse } from '#shared/schemas/fill-plan.ts'

export interface PreviewError {
  message: string
  /** the request field the engine named, when it did */
  field: string | null
  /** 422: the target cannot be reached with these sources / cylinder; 400: the input is wrong */
  status: 400 | 422
}

export type PlanPreview = { ok: true; plan: FillPlanResponse } | { ok: false; error: PreviewError }

function toError(err: unknown): PreviewError {
  const e = err as { message?: string; field?: string; status?: number; name?: string }
  return {
    message: e?.message ?? String(err),
    field: typeof e?.field === 'string' ? e.field.replace(/\[(\d+)\]/g, '.$1') : null,
    status: e?.status === 422 ? 422 : 400,
  }
}

/** The plan computed in the browser with the shared engine: a preview only; the server recomputes on save. */
export function previewPlan(request: FillPlanRequest): PlanPreview {
  try {
    return { ok: true, plan: fillPlanFromRequest(request) }
  } catch (err) {
    return { ok: false, error: toError(err) }
  }
}

export type ComparisonPreview = { ok: true; comparison: CompareModelsResponse } | { ok: false; error: PreviewError }

/** Every model's plan for the same request, and what each would really produce (per the reference model). */
export function previewComparison(request: FillPlanRequest): ComparisonPreview {
  try {
    return { ok: true, comparison: compareModelsFromRequest({ ...request, models: ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008'] }) }
  } catch (err) {
    return { ok: false, error: toError(err) }
  }
}
