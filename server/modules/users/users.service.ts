import type { EntityManager } from '@mikro-orm/core'
import type { SessionUser } from '#shared/schemas/auth.ts'
import type { User as UserDto, UserCreateInput, UserUpdateInput } from '#shared/schemas/user.ts'
import { audit } from '../../lib/audit.ts'
import { ConflictError, ForbiddenError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { hashPassword, verifyPassword } from '../../lib/passwords.ts'
import { AuditEventSchema } from '../audit/audit-event.entity.ts'
import { CustomerSchema } from '../customers/customer.entity.ts'
import { type User, UserSchema } from './user.entity.ts'

function toDto(u: User): UserDto {
  const customer = u.customer as { id: number; company?: string } | null
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: u.roles,
    active: u.active,
    customerId: customer?.id ?? null,
    customerName: customer?.company ?? null,
    createdAt: u.createdAt.toISOString(),
  }
}

async function customerRef(em: EntityManager, customerId: number | null) {
  if (customerId === null) return null
  const c = await em.findOne(CustomerSchema, { id: customerId })
  if (!c) throw new UnprocessableError('That customer does not exist.', [{ field: 'customerId', message: 'Unknown customer' }])
  return c
}

export async function listUsers(em: EntityManager) {
  const users = await em.find(UserSchema, {}, { populate: ['customer'], orderBy: { email: 'asc' } })
  return { items: users.map(toDto) }
}

export async function createUser(em: EntityManager, actor: SessionUser, input: UserCreateInput) {
  if (await em.count(UserSchema, { email: input.email })) throw new ConflictError('An account with this e-mail already exists.')
  const customer = await customerRef(em, input.roles.includes('customer') ? input.customerId : null)
  const user = em.create(UserSchema, {
    email: input.email,
    name: input.name,
    roles: input.roles,
    active: true,
    customer,
    passwordHash: await hashPassword(input.password),
  })
  await em.flush()
  audit(em, actor, 'user.created', 'user', user.id, { email: user.email, roles: user.roles })
  await em.flush()
  return toDto(user)
}

export async function updateUser(em: EntityManager, actor: SessionUser, id: number, input: UserUpdateInput) {
  const user = await em.findOne(UserSchema, { id }, { populate: ['customer'] })
  if (!user) throw new NotFoundError('No such account.')
  if (id === actor.id && (!input.active || !input.roles.includes('admin'))) {
    throw new UnprocessableError('You cannot remove your own admin role or deactivate yourself; ask another admin.', [
      { field: 'roles', message: 'Keep your admin role' },
    ])
  }
  user.name = input.name
  user.roles = input.roles
  user.active = input.active
  user.customer = await customerRef(em, input.roles.includes('customer') ? input.customerId : null)
  audit(em, actor, 'user.updated', 'user', user.id, { roles: input.roles, active: input.active })
  await em.flush()
  return toDto(user)
}

export async function resetPassword(em: EntityManager, actor: SessionUser, id: number, password: string) {
  const user = await em.findOne(UserSchema, { id })
  if (!user) throw new NotFoundError('No such account.')
  user.passwordHash = await hashPassword(password)
  audit(em, actor, 'user.password-reset', 'user', user.id)
  await em.flush()
}

export async function changeOwnPassword(em: EntityManager, actor: SessionUser, currentPassword: string, newPassword: string) {
  const user = await em.findOne(UserSchema, { id: actor.id }, { populate: ['passwordHash'] })
  if (!user) throw new NotFoundError('No such account.')
  if (!(await verifyPassword(user.passwordHash, currentPassword))) throw new ForbiddenError('The current password is not right.')
  user.passwordHash = await hashPassword(newPassword)
  audit(em, actor, 'user.password-changed', 'user', user.id)
  await em.flush()
}

export async function listAudit(em: EntityManager, q: { entityType?: string; entityId?: string; limit: number }) {
  const where: Record<string, string> = {}
  if (q.entityType) where.entityType = q.entityType
  if (q.entityId) where.entityId = q.entityId
  const rows = await em.find(AuditEventSchema, where, { orderBy: { id: 'desc' }, limit: q.limit })
  return {
    items: rows.map((r) => ({
      id: r.id,
      at: r.at.toISOString(),
      actorEmail: r.actorEmail ?? null,
      action: r.action,
      entityType: r.entityType,
      entityId: r.entityId,
      detail: r.detail ?? null,
    })),
  }
}
