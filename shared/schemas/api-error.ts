import { z } from 'zod'

/** RFC 9457 problem details, the one error shape of the API. */
export const ApiErrorBodySchema = z.object({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  detail: z.string(),
  instance: z.string().optional(),
  /** per-field errors for validation failures */
  errors: z.array(z.object({ field: z.string(), message: z.string(), code: z.string().optional() })).optional(),
})
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>
