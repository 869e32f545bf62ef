import type { EntityManager, MikroORM } from '@mikro-orm/core'
import type { Role } from '#shared/schemas/auth.ts'
import { hashPassword } from '../lib/passwords.ts'
import { CustomerSchema } from '../modules/customers/customer.entity.ts'
import { CylinderSchema } from '../modules/cylinders/cylinder.entity.ts'
import { UserSchema } from '../modules/users/user.entity.ts'

/**
 * The demo scenario — all invented: Kestrel Ridge Gas Blending, a small specialty gas shop, its staff
 * and four customers. Runs only on an empty database.
 */
export const DEMO_SHOP = {
  name: 'Kestrel Ridge Gas Blending',
  address: 'Unit 7, Tallow Lane Trading Estate, Kestrel Ridge',
  phone: '+00 555 0142',
  email: 'desk@kestrel-ridge.test',
}

const CUSTOMERS = [
  {
    code: 'ALDB',
    company: 'Alderbank Environmental Laboratory',
    contactName: 'Priya Venn',
    contactEmail: 'customer@demo.test',
    phone: '+00 555 0190',
    billingAddress: '14 Sorrel Street\nAlderbank',
  },
  {
    code: 'BRWS',
    company: 'Brightwater Welding Supply',
    contactName: 'Tomas Quill',
    contactEmail: 'orders@brightwater-welding.test',
    phone: '+00 555 0171',
    billingAddress: '3 Forge Row\nBrightwater',
  },
  {
    code: 'CRVF',
    company: 'Corvel Fresh Foods',
    contactName: 'Hanne Lidgate',
    contactEmail: 'packaging@corvel-foods.test',
    phone: '+00 555 0133',
    billingAddress: 'Cold Store 2, Marram Quay\nCorvel',
  },
  {
    code: 'DNMR',
    company: 'Dunmore Detector Service',
    contactName: 'Osei Brandt',
    contactEmail: 'calibration@dunmore-detect.test',
    phone: '+00 555 0168',
    billingAddress: '88 Lantern Hill\nDunmore',
  },
] as const

const STAFF: { email: string; name: string; roles: Role[] }[] = [
  { email: 'admin@demo.test', name: 'Maren Holt (shop manager)', roles: ['admin'] },
  { email: 'sales@demo.test', name: 'Jonah Pell', roles: ['sales'] },
  { email: 'blender@demo.test', name: 'Ines Carrow', roles: ['blender'] },
  { email: 'technician@demo.test', name: 'Dev Okafor', roles: ['technician'] },
  { email: 'qa@demo.test', name: 'Ruth Ashdown', roles: ['qa'] },
]

function isoDate(d: Date): string {
  return d.toISOString().slice(0, 10)
}
function addYears(d: Date, years: number): Date {
  const x = new Date(d)
  x.setFullYear(x.getFullYear() + years)
  return x
}

async function seedCylinders(em: EntityManager, customers: { id: number }[]): Promise<void> {
  const today = new Date()
  const specs = [
    {
      prefix: 'KR-S50',
      count: 8,
      waterVolumeL: 50,
      servicePressureBar: 200,
      testPressureBar: 300,
      material: 'steel' as const,
      valveOutlet: 'DIN 477 No. 10',
      oxygenClean: false,
    },
    {
      prefix: 'KR-A10',
      count: 8,
      waterVolumeL: 10,
      servicePressureBar: 150,
      testPressureBar: 250,
      material: 'aluminium' as const,
      valveOutlet: 'DIN 477 No. 14',
      oxygenClean: true,
    },
    {
      prefix: 'KR-S40',
      count: 4,
      waterVolumeL: 40,
      servicePressureBar: 200,
      testPressureBar: 300,
      material: 'steel' as const,
      valveOutlet: 'DIN 477 No. 6',
      oxygenClean: true,
    },
    {
      prefix: 'KR-A05',
      count: 4,
      waterVolumeL: 5,
      servicePressureBar: 150,
      testPressureBar: 250,
      material: 'aluminium' as const,
      valveOutlet: 'DIN 477 No. 1',
      oxygenClean: false,
    },
  ]
  let n = 0
  for (const spec of specs) {
    for (let i = 1; i <= spec.count; i++) {
      n++
      // test dates spread over the last 9 years; one cylinder per family is overdue for its test
      const lastTest = new Date(today)
      lastTest.setMonth(lastTest.getMonth() - ((n * 7) % 100))
      const overdue = i === spec.count
      // an overdue cylinder missed its 10-year retest by a few weeks to a few months
      if (overdue) {
        lastTest.setTime(today.getTime())
        lastTest.setDate(lastTest.getDate() - 3650 - 20 * n)
      }
      const next = addYears(lastTest, 10)
      const serial = `${spec.prefix}-${String(1000 + n)}`
      em.create(CylinderSchema, {
        serial,
        barcode: `FW${String(100000 + n)}`,
        waterVolumeL: spec.waterVolumeL,
        servicePressureBar: spec.servicePressureBar,
        testPressureBar: spec.testPressureBar,
        material: spec.material,
        valveOutlet: spec.valveOutlet,
        oxygenClean: spec.oxygenClean,
        owner: n % 6 === 0 ? (customers[n % customers.length] as never) : null,
        lastTestDate: isoDate(lastTest),
        nextTestDate: isoDate(next),
        status: overdue ? 'quarantine' : 'available',
        residual: n % 5 === 0 ? { kind: 'residual', pressureBarGauge: 2, composition: [{ gas: 'nitrogen', fraction: 1 }] } : { kind: 'evacuated' },
        notes: overdue ? 'Periodic inspection overdue: send for retest before use.' : '',
      })
    }
  }
}

/** Demo seeding hooks that later modules add to (orders, price book, …); each runs in the same transaction. */
export type SeedStep = (em: EntityManager, ctx: SeedContext) => Promise<void>
export interface SeedContext {
  demoPassword: string
  customers: { id: number; code: string }[]
  users: Record<string, { id: number }>
}
const extraSteps: SeedStep[] = []
export function addSeedStep(step: SeedStep): void {
  extraSteps.push(step)
}

/** Seeds the demo scenario when the database has no users. Returns true when it seeded. */
export async function seedDemoIfEmpty(orm: MikroORM, demoPassword: string): Promise<boolean> {
  const em = orm.em.fork()
  if ((await em.count(UserSchema, {})) > 0) return false
  const passwordHash = await hashPassword(demoPassword)
  await em.transactional(async (tx) => {
    const customers = CUSTOMERS.map((c) => tx.create(CustomerSchema, { ...c, paymentProviderId: null }))
    await tx.flush()
    const users: Record<string, { id: number }> = {}
    for (const s of STAFF) users[s.email] = tx.create(UserSchema, { ...s, passwordHash, active: true, customer: null })
    users['customer@demo.test'] = tx.create(UserSchema, {
      email: 'customer@demo.test',
      name: 'Priya Venn (Alderbank Environmental Laboratory)',
      roles: ['customer'],
      passwordHash,
      active: true,
      customer: customers[0],
    })
    await seedCylinders(tx, customers)
    await tx.flush()
    const ctx: SeedContext = { demoPassword, customers: customers.map((c) => ({ id: c.id, code: c.code })), users }
    for (const step of extraSteps) {
      await step(tx, ctx)
      await tx.flush()
    }
  })
  return true
}
