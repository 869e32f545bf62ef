import type { EntityManager } from '@mikro-orm/core'
import type { SessionUser } from '#shared/schemas/auth.ts'
import type { Customer, CustomerInput, CustomerList, CustomerListQuery } from '#shared/schemas/customer.ts'
import { audit } from '../../lib/audit.ts'
import { ConflictError, NotFoundError } from '../../lib/http-errors.ts'
import { type Customer as CustomerEntity, CustomerSchema } from './customer.entity.ts'

export function toCustomerDto(c: CustomerEntity): Customer {
  return {
    id: c.id,
    code: c.code,
    company: c.company,
    contactName: c.contactName,
    contactEmail: c.contactEmail,
    phone: c.phone,
    billingAddress: c.billingAddress,
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
  }
}

/** Customers by company name; `q` matches code, company, contact and e-mail (case-insensitive). */
export async function listCustomers(em: EntityManager, query: CustomerListQuery): Promise<CustomerList> {
  const q = query.q?.toLowerCase()
  const where = q
    ? {
        $or: [
          { code: { $like: `%${q.toUpperCase()}%` } },
          { company: { $like: `%${q}%` } },
          { contactName: { $like: `%${q}%` } },
          { contactEmail: { $like: `%${q}%` } },
        ],
      }
    : {}
  const rows = await em.find(CustomerSchema, where, { orderBy: { company: 'asc', id: 'asc' }, limit: 500 })
  return { items: rows.map(toCustomerDto) }
}

export async function getCustomer(em: EntityManager, id: number): Promise<Customer> {
  const c = await em.findOne(CustomerSchema, { id })
  if (!c) throw new NotFoundError(`No customer ${id}.`)
  return toCustomerDto(c)
}

async function assertCodeFree(em: EntityManager, code: string, exceptId?: number): Promise<void> {
  const other = await em.findOne(CustomerSchema, { code }, { fields: ['id'] })
  if (other && other.id !== exceptId) {
    throw new ConflictError(`The customer code ${code} is already used by another customer.`, {
      errors: [{ field: 'code', message: 'Already used by another customer' }],
    })
  }
}

export async function createCustomer(em: EntityManager, user: SessionUser, input: CustomerInput): Promise<Customer> {
  return em.transactional(async (tx) => {
    await assertCodeFree(tx, input.code)
    const c = tx.create(CustomerSchema, { ...input, paymentProviderId: null })
    await tx.flush()
    audit(tx, user, 'customer.created', 'Customer', c.id, { code: c.code })
    await tx.flush()
    return toCustomerDto(c)
  })
}

export async function updateCustomer(em: EntityManager, user: SessionUser, id: number, input: CustomerInput): Promise<Customer> {
  return em.transactional(async (tx) => {
    const c = await tx.findOne(CustomerSchema, { id })
    if (!c) throw new NotFoundError(`No customer ${id}.`)
    await assertCodeFree(tx, input.code, id)
    const changed = (Object.keys(input) as (keyof CustomerInput)[]).filter((k) => c[k] !== input[k])
    tx.assign(c, input)
    if (changed.length) audit(tx, user, 'customer.updated', 'Customer', c.id, { fields: changed })
    await tx.flush()
    return toCustomerDto(c)
  })
}
