import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CylinderSchema as CylinderEntity } from '#server/modules/cylinders/cylinder.entity.ts'
import { addDaysIso, localIsoDate } from '#shared/schemas/cylinder.ts'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let blender: SignedInAgent
let technician: SignedInAgent

beforeAll(async () => {
  t = await createTestApp()
  blender = await t.signIn('blender')
  technician = await t.signIn('technician')
})
afterAll(async () => {
  await t.close()
})

const countCylinders = () => t.orm.em.fork().count(CylinderEntity, {})

/** GET a binary (PDF) answer as a Buffer body. */
function getBinary(agent: SignedInAgent['agent'], url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
}

const future = addDaysIso(localIsoDate(), 3 * 365)
const past = addDaysIso(localIsoDate(), -5 * 365)

function newCylinder(overrides: Record<string, unknown> = {}) {
  return {
    serial: 'T-NEW-0001',
    barcode: 'TB0001',
    waterVolumeL: 10,
    servicePressureBar: 200,
    testPressureBar: 300,
    material: 'steel',
    valveOutlet: 'DIN 477 No. 10',
    oxygenClean: false,
    ownerId: null,
    lastTestDate: past,
    nextTestDate: future,
    ...overrides,
  }
}

describe('inventory', () => {
  it('lists the seeded cylinders to a technician, and refuses customers', async () => {
    const res = await technician.agent.get('/api/cylinders').expect(200)
    expect(res.body.total).toBe(await countCylinders())
    expect(res.body.items[0]).toHaveProperty('testState')
    const customer = await t.signIn('customer')
    await customer.agent.get('/api/cylinders').expect(403)
  })

  it('filters by search text and by overdue test', async () => {
    const search = await technician.agent.get('/api/cylinders').query({ q: 'kr-a10' }).expect(200)
    expect(search.body.total).toBe(8)
    expect(search.body.items.every((c: { serial: string }) => c.serial.startsWith('KR-A10'))).toBe(true)
    const overdue = await technician.agent.get('/api/cylinders').query({ test: 'overdue' }).expect(200)
    // the demo seed makes the last cylinder of each of its four families overdue
    const overdueInDb = await t.orm.em.fork().count(CylinderEntity, { nextTestDate: { $lt: localIsoDate() } })
    expect(overdueInDb).toBeGreaterThanOrEqual(4)
    expect(overdue.body.total).toBe(overdueInDb)
    for (const c of overdue.body.items) {
      expect(c.nextTestDate < localIsoDate()).toBe(true)
      expect(c.blocked).toBe(true)
      expect(c.testState).toBe('overdue')
      expect(c.blockReason).toMatch(/periodic test date/)
    }
    await technician.agent.get('/api/cylinders').query({ test: 'someday' }).expect(400)
  })

  it('creates (201), refuses a duplicate serial (409) and a test pressure below service pressure (400)', async () => {
    const created = await blender.agent.post('/api/cylinders').set('x-csrf-token', blender.csrf).send(newCylinder()).expect(201)
    expect(created.body.serial).toBe('T-NEW-0001')
    expect(created.body.blocked).toBe(false)
    const dup = await blender.agent
      .post('/api/cylinders')
      .set('x-csrf-token', blender.csrf)
      .send(newCylinder({ barcode: 'TB0002' }))
      .expect(409)
    expect(dup.body.errors[0].field).toBe('serial')
    const bad = await blender.agent
      .post('/api/cylinders')
      .set('x-csrf-token', blender.csrf)
      .send(newCylinder({ serial: 'T-NEW-0003', barcode: 'TB0003', testPressureBar: 150 }))
      .expect(400)
    expect(bad.body.errors.map((e: { field: string }) => e.field)).toContain('testPressureBar')
    await technician.agent
      .post('/api/cylinders')
      .set('x-csrf-token', technician.csrf)
      .send(newCylinder({ serial: 'T-X', barcode: 'TX' }))
      .expect(403)
  })

  it('edits with the version read, and answers 409 to a stale version', async () => {
    const list = await blender.agent.get('/api/cylinders').query({ q: 'T-NEW-0001' }).expect(200)
    const c = list.body.items[0]
    const { id, ownerName, testState, blocked, blockReason, version, updatedAt, status, ...fields } = c
    const edited = await blender.agent
      .put(`/api/cylinders/${id}`)
      .set('x-csrf-token', blender.csrf)
      .send({ ...fields, notes: 'valve replaced', expectedVersion: version })
      .expect(200)
    expect(edited.body.notes).toBe('valve replaced')
    expect(edited.body.version).toBe(version + 1)
    const stale = await blender.agent
      .put(`/api/cylinders/${id}`)
      .set('x-csrf-token', blender.csrf)
      .send({ ...fields, notes: 'second tablet', expectedVersion: version })
      .expect(409)
    expect(stale.body.current.notes).toBe('valve replaced')
  })

  it('shows an overdue cylinder as blocked with the reason', async () => {
    const overdue = (await technician.agent.get('/api/cylinders').query({ test: 'overdue', limit: 1 }).expect(200)).body.items[0]
    const one = await technician.agent.get(`/api/cylinders/${overdue.id}`).expect(200)
    expect(one.body.blocked).toBe(true)
    expect(one.body.blockReason).toContain(one.body.nextTestDate)
  })

  it('finds a cylinder by scanned barcode', async () => {
    const res = await technician.agent.get('/api/cylinders/lookup').query({ code: 'FW100001' }).expect(200)
    expect(res.body.barcode).toBe('FW100001')
    await technician.agent.get('/api/cylinders/lookup').query({ code: 'NOPE' }).expect(404)
  })

  it('answers 404 for an unknown cylinder and 400 for a non-numeric id', async () => {
    await technician.agent.get('/api/cylinders/999999').expect(404)
    await technician.agent.get('/api/cylinders/abc').expect(400)
  })
})

describe('CSV import', () => {
  const header =
    'serial,barcode,water_volume_l,service_pressure_bar,test_pressure_bar,material,valve_outlet,oxygen_clean,owner_code,last_test_date,next_test_date,notes'
  const csv = [
    header,
    `CSV-0001,CB0001,50,200,300,steel,DIN 477 No. 10,no,,${past},${future},first`,
    `CSV-0002,CB0002,fifty,200,300,steel,DIN 477 No. 10,no,,${past},${future},`,
    `KR-S50-1001,CB0003,50,200,300,steel,DIN 477 No. 10,no,,${past},${future},`,
    `CSV-0004,CB0004,10,150,250,aluminum,DIN 477 No. 14,yes,DNMR,${past},${future},`,
    `CSV-0005,CB0005,10,150,250,brass,DIN 477 No. 14,maybe,ZZZZ,${past},2020-02-30,`,
    `CSV-0001,CB0006,10,150,250,steel,DIN 477 No. 14,no,,${past},${future},`,
  ].join('\n')

  it('previews row by row with per-row errors and saves nothing', async () => {
    const before = await countCylinders()
    const res = await blender.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from(csv), { filename: 'cylinders.csv', contentType: 'text/csv' })
      .expect(200)
    expect(res.body.rows).toHaveLength(6)
    expect(res.body.validCount).toBe(2)
    expect(res.body.errorCount).toBe(4)
    const byLine = Object.fromEntries(res.body.rows.map((r: { line: number }) => [r.line, r]))
    expect(byLine[2].ok).toBe(true)
    expect(byLine[3].errors[0]).toMatchObject({ field: 'water_volume_l' })
    expect(byLine[4].errors.map((e: { message: string }) => e.message).join(' ')).toMatch(/already in the inventory/)
    expect(byLine[5].ok).toBe(true)
    expect(byLine[5].values).toMatchObject({ material: 'aluminium', oxygenClean: true, ownerCode: 'DNMR' })
    const fields5 = byLine[6].errors.map((e: { field: string }) => e.field)
    expect(fields5).toEqual(expect.arrayContaining(['material', 'oxygen_clean', 'owner_code', 'next_test_date']))
    expect(byLine[7].errors.map((e: { message: string }) => e.message).join(' ')).toMatch(/earlier line/)
    expect(await countCylinders()).toBe(before)
  })

  it('confirm saves exactly the valid rows in one go', async () => {
    const before = await countCylinders()
    const res = await blender.agent
      .post('/api/cylinders/import/confirm')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from(csv), { filename: 'cylinders.csv', contentType: 'text/csv' })
      .expect(201)
    expect(res.body.created).toBe(2)
    expect(res.body.skipped).toBe(4)
    expect(await countCylinders()).toBe(before + 2)
    const again = await blender.agent
      .post('/api/cylinders/import/confirm')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from(csv), { filename: 'cylinders.csv', contentType: 'text/csv' })
      .expect(422)
    expect(again.body.detail).toBeTruthy()
    expect(await countCylinders()).toBe(before + 2)
  })

  it('reads semicolon-separated files with decimal commas', async () => {
    const semi = `${header.replaceAll(',', ';')}\nCSV-0100;CB0100;10,5;150;250;steel;DIN 477 No. 1;no;;${past};${future};`
    const res = await blender.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from(semi), { filename: 'semi.csv', contentType: 'text/csv' })
      .expect(200)
    expect(res.body.rows[0].ok).toBe(true)
    expect(res.body.rows[0].values.waterVolumeL).toBe(10.5)
  })

  it('reports missing columns as a file error', async () => {
    const res = await blender.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from('serial,barcode\nA,B\n'), { filename: 'short.csv', contentType: 'text/csv' })
      .expect(200)
    expect(res.body.fileErrors[0]).toMatch(/Missing columns/)
    expect(res.body.validCount).toBe(0)
  })

  it('refuses a file that is not CSV (415), no file (400), a file over the limit (413), and technicians (403)', async () => {
    await blender.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from([0x89, 0x50, 0x4e, 0x47]), { filename: 'photo.png', contentType: 'image/png' })
      .expect(415)
    await blender.agent.post('/api/cylinders/import/preview').set('x-csrf-token', blender.csrf).field('note', 'x').expect(400)
    const big = `${header}\n${'x'.repeat(600 * 1024)}`
    await blender.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from(big), { filename: 'big.csv', contentType: 'text/csv' })
      .expect(413)
    await technician.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', technician.csrf)
      .attach('file', Buffer.from(csv), { filename: 'cylinders.csv', contentType: 'text/csv' })
      .expect(403)
  })

  it('serves a template whose header the import accepts', async () => {
    const tpl = await blender.agent.get('/api/cylinders/import/template').expect(200)
    expect(tpl.headers['content-type']).toMatch(/text\/csv/)
    const res = await blender.agent
      .post('/api/cylinders/import/preview')
      .set('x-csrf-token', blender.csrf)
      .attach('file', Buffer.from(tpl.text), { filename: 'template.csv', contentType: 'text/csv' })
      .expect(200)
    expect(res.body.fileErrors).toEqual([])
    expect(res.body.rows).toHaveLength(1)
  })
})

describe('label', () => {
  it('is a PDF for the technician', async () => {
    const res = await getBinary(technician.agent, '/api/cylinders/1/label.pdf').expect(200)
    expect(res.headers['content-type']).toBe('application/pdf')
    const body = res.body as Buffer
    expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(body.length).toBeGreaterThan(3000)
  })

  it('prints on US Letter too, and refuses an unknown size', async () => {
    await getBinary(technician.agent, '/api/cylinders/1/label.pdf?size=LETTER').expect(200)
    await technician.agent.get('/api/cylinders/1/label.pdf').query({ size: 'A0' }).expect(400)
  })

  it('is refused to QA (403) and 404 for an unknown cylinder', async () => {
    const qa = await t.signIn('qa')
    await qa.agent.get('/api/cylinders/1/label.pdf').expect(403)
    await technician.agent.get('/api/cylinders/424242/label.pdf').expect(404)
  })
})

describe('history', () => {
  it('is empty for a cylinder never filled, and 404 for an unknown one', async () => {
    const created = await blender.agent
      .post('/api/cylinders')
      .set('x-csrf-token', blender.csrf)
      .send(newCylinder({ serial: 'T-HIST-0001', barcode: 'THIST0001' }))
      .expect(201)
    const res = await technician.agent.get(`/api/cylinders/${created.body.id}/history`).expect(200)
    expect(res.body).toEqual({ cylinderId: created.body.id, runs: [] })
    await technician.agent.get('/api/cylinders/987654/history').expect(404)
  })
})
