import type { EntityManager } from '@mikro-orm/core'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { type PriceBook, type PriceEntry, type PriceEntryInput, SHOP_CURRENCY } from '#shared/schemas/pricing.ts'
import { isPriceableGas } from '#shared/schemas/quote.ts'
import { audit } from '../../lib/audit.ts'
import { BadRequestError, ConflictError, NotFoundError } from '../../lib/http-errors.ts'
import { type PriceEntry as PriceEntryEntity, PriceEntrySchema } from './price-entry.entity.ts'

const KIND_ORDER = { gas: 0, rental: 1, certification: 2, surcharge: 3 } as const

export function toPriceEntryDto(e: PriceEntryEntity): PriceEntry {
  return {
    id: e.id,
    kind: e.kind,
    key: e.key,
    label: e.label,
    unit: e.unit,
    priceMinor: e.priceMinor,
    currency: e.currency,
    updatedAt: e.updatedAt.toISOString(),
  }
}

/** The whole price book (a few dozen lines), in kind order then key. */
export async function getPriceBook(em: EntityManager): Promise<PriceBook> {
  const rows = await em.find(PriceEntrySchema, {}, { orderBy: { kind: 'asc', key: 'asc' } })
  const entries = rows.map(toPriceEntryDto).sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || a.key.localeCompare(b.key, 'en', { numeric: true }))
  return { currency: SHOP_CURRENCY, entries }
}

function checkGasKey(input: PriceEntryInput): void {
  if (input.kind === 'gas' && !isPriceableGas(input.key)) {
    throw new BadRequestError(`"${input.key}" is not a gas of the gas library.`, [{ field: 'key', message: 'Not a gas of the gas library' }])
  }
}

async function assertKeyFree(em: EntityManager, input: PriceEntryInput, exceptId?: number): Promise<void> {
  const other = await em.findOne(PriceEntrySchema, { kind: input.kind, key: input.key }, { fields: ['id'] })
  if (other && other.id !== exceptId) {
    throw new ConflictError(`The price book already has a ${input.kind} line for "${input.key}"; edit that line instead.`, {
      errors: [{ field: 'key', message: 'Already in the price book' }],
    })
  }
}

export async function createPriceEntry(em: EntityManager, user: SessionUser, input: PriceEntryInput): Promise<PriceEntry> {
  checkGasKey(input)
  return em.transactional(async (tx) => {
    await assertKeyFree(tx, input)
    const e = tx.create(PriceEntrySchema, { ...input, currency: SHOP_CURRENCY })
    await tx.flush()
    audit(tx, user, 'price.created', 'PriceEntry', e.id, { kind: e.kind, key: e.key, priceMinor: e.priceMinor })
    await tx.flush()
    return toPriceEntryDto(e)
  })
}

export async function updatePriceEntry(em: EntityManager, user: SessionUser, id: number, input: PriceEntryInput): Promise<PriceEntry> {
  checkGasKey(input)
  return em.transactional(async (tx) => {
    const e = await tx.findOne(PriceEntrySchema, { id })
    if (!e) throw new NotFoundError(`No price-book line ${id}.`)
    await assertKeyFree(tx, input, id)
    const before = e.priceMinor
    tx.assign(e, input)
    audit(tx, user, 'price.updated', 'PriceEntry', e.id, { kind: e.kind, key: e.key, fromMinor: before, toMinor: e.priceMinor })
    await tx.flush()
    return toPriceEntryDto(e)
  })
}

export async function deletePriceEntry(em: EntityManager, user: SessionUser, id: number): Promise<void> {
  await em.transactional(async (tx) => {
    const e = await tx.findOne(PriceEntrySchema, { id })
    if (!e) throw new NotFoundError(`No price-book line ${id}.`)
    audit(tx, user, 'price.deleted', 'PriceEntry', e.id, { kind: e.kind, key: e.key, priceMinor: e.priceMinor })
    tx.remove(e)
    await tx.flush()
  })
}
