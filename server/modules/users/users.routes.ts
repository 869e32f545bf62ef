import { OkSchema } from '#shared/schemas/auth.ts'
import {
  AuditListSchema,
  AuditQuerySchema,
  OwnPasswordChangeSchema,
  UserCreateInputSchema,
  UserIdParamsSchema,
  UserListSchema,
  UserPasswordResetSchema,
  UserSchema,
  UserUpdateInputSchema,
} from '#shared/schemas/user.ts'
import { defineRoute } from '../../lib/route.ts'
import { changeOwnPassword, createUser, listAudit, listUsers, resetPassword, updateUser } from './users.service.ts'

defineRoute({
  method: 'get',
  path: '/api/users',
  summary: 'All accounts',
  tags: ['accounts'],
  access: ['admin'],
  response: UserListSchema,
  handler: ({ em }) => listUsers(em),
})

defineRoute({
  method: 'post',
  path: '/api/users',
  summary: 'Create an account (staff or customer) with a first password',
  tags: ['accounts'],
  access: ['admin'],
  body: UserCreateInputSchema,
  response: UserSchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createUser(em, user, body),
})

defineRoute({
  method: 'put',
  path: '/api/users/:id',
  summary: 'Change an account: name, roles, customer, active',
  tags: ['accounts'],
  access: ['admin'],
  params: UserIdParamsSchema,
  body: UserUpdateInputSchema,
  response: UserSchema,
  handler: ({ em, user, params, body }) => updateUser(em, user, params.id, body),
})

defineRoute({
  method: 'post',
  path: '/api/users/:id/password',
  summary: 'Set a new password for an account',
  tags: ['accounts'],
  access: ['admin'],
  params: UserIdParamsSchema,
  body: UserPasswordResetSchema,
  response: OkSchema,
  handler: async ({ em, user, params, body }) => {
    await resetPassword(em, user, params.id, body.password)
    return { ok: true as const }
  },
})

defineRoute({
  method: 'post',
  path: '/api/auth/password',
  summary: 'Change your own password',
  tags: ['auth'],
  access: 'signed-in',
  body: OwnPasswordChangeSchema,
  response: OkSchema,
  handler: async ({ em, user, body }) => {
    await changeOwnPassword(em, user, body.currentPassword, body.newPassword)
    return { ok: true as const }
  },
})

defineRoute({
  method: 'get',
  path: '/api/audit',
  summary: 'The audit trail, newest first',
  tags: ['accounts'],
  access: ['admin'],
  query: AuditQuerySchema,
  response: AuditListSchema,
  handler: ({ em, query }) => listAudit(em, query),
})
