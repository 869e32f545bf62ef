import { z } from 'zod'
import { ROLES } from '#shared/schemas/auth.ts'
import { ApiErrorBodySchema } from '#shared/schemas/api-error.ts'
import { type RouteDefinition, rolesOf } from './route.ts'

type JsonSchema = Record<string, unknown>

function toSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const json = z.toJSONSchema(schema, { io, unrepresentable: 'any', target: 'draft-2020-12' }) as JsonSchema
  delete json.$schema
  return json
}

function parameters(def: RouteDefinition<any, any, any>): JsonSchema[] {
  const out: JsonSchema[] = []
  for (const [where, schema] of [
    ['path', def.params],
    ['query', def.query],
  ] as const) {
    if (!schema) continue
    const json = toSchema(schema as z.ZodType, 'input')
    const props = (json.properties ?? {}) as Record<string, JsonSchema>
    const required = new Set((json.required as string[] | undefined) ?? [])
    for (const [name, prop] of Object.entries(props)) {
      out.push({ name, in: where, required: where === 'path' || required.has(name), schema: prop })
    }
  }
  return out
}

const problem = { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } }

/** Builds the OpenAPI 3.1 document from the route registry (zod's own JSON Schema output). */
export function buildOpenApi(routes: readonly RouteDefinition<any, any, any>[]): JsonSchema {
  const paths: Record<string, Record<string, JsonSchema>> = {}
  for (const def of routes) {
    const oaPath = def.path.replace(/:([A-Za-z0-9_]+)/g, '{$1}')
    const roles = rolesOf(def.access, ROLES)
    const responses: Record<string, JsonSchema> = {
      [String(def.successStatus ?? (def.response || def.produces ? 200 : 204))]: {
        description: 'Success',
        ...(def.produces
          ? { content: { [def.produces]: { schema: { type: 'string', format: 'binary' } } } }
          : def.response
            ? { content: { 'application/json': { schema: toSchema(def.response, 'output') } } }
            : {}),
      },
      '400': { description: 'Invalid input (problem details naming the field)', content: problem },
    }
    if (def.access !== 'public') {
      responses['401'] = { description: 'Not signed in', content: problem }
      responses['403'] = { description: 'Role not allowed, or missing CSRF token', content: problem }
    }
    const op: JsonSchema = {
      operationId: `${def.method}${oaPath.replace(/[{}]/g, '').replace(/[^A-Za-z0-9]+(.)?/g, (_m, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
      summary: def.summary,
      tags: def.tags,
      'x-roles': roles,
      parameters: parameters(def),
      responses,
    }
    if (def.access !== 'public') op.security = [{ session: [] }]
    if (def.body) {
      op.requestBody = { required: true, content: { 'application/json': { schema: toSchema(def.body as z.ZodType, 'input') } } }
    }
    if (def.upload) {
      op.requestBody = {
        required: true,
        content: {
          'multipart/form-data': {
            schema: {
              type: 'object',
              required: [def.upload.field],
              properties: { [def.upload.field]: { type: 'string', format: 'binary', contentMediaType: def.upload.types.join(', ') } },
            },
          },
        },
        'x-max-bytes': def.upload.maxBytes,
      }
    }
    paths[oaPath] ??= {}
    paths[oaPath][def.method] = op
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Fillwright API',
      version: '0.1.0',
      description:
        'Specialty gas blending: specifications, fill plans, fill runs, analysis and certificates. ' +
        'Unsafe methods need the X-CSRF-Token header (token from GET /api/auth/csrf). ' +
        '`x-roles` lists the roles allowed for each operation (empty = public).',
    },
    servers: [{ url: '/' }],
    components: {
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'fillwright.sid' } },
      schemas: { Problem: toSchema(ApiErrorBodySchema, 'output') },
    },
    paths,
  }
}
