import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CertificateSchema } from '#server/modules/quality/quality.entity.ts'
import { createQaScenario, pdfText, type QaScenario } from '#tests/support/qa-scenario.ts'
import { createTestApp, DEMO_PASSWORD, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let qa: SignedInAgent
let customer: SignedInAgent

const GOOD = {
  results: [
    {
      gas: 'carbon-dioxide',
      value: 2.03,
      unit: 'percent',
      expandedUncertainty: 0.02,
      coverageFactor: 2,
      instrument: 'NDIR analyser AN-3',
      method: 'NDIR, two-point bracketing',
    },
    {
      gas: 'carbon-monoxide',
      value: 498,
      unit: 'ppm',
      expandedUncertainty: 6,
      coverageFactor: 2,
      instrument: 'NDIR analyser AN-3',
      method: 'NDIR, multipoint calibration',
    },
  ],
}

/** a released certificate (revision 1) for a new order of the given customer */
async function released(customerCode = 'ALDB'): Promise<{ s: QaScenario; id: number; number: string }> {
  const s = await createQaScenario(t.orm, { customerCode })
  await qa.agent.put(`/api/quality/runs/${s.runIds[0]}/analysis`).set('x-csrf-token', qa.csrf).send(GOOD).expect(200)
  const res = await qa.agent
    .post(`/api/quality/runs/${s.runIds[0]}/release`)
    .set('x-csrf-token', qa.csrf)
    .send({ password: DEMO_PASSWORD, validityMonths: 24, minimumUsePressureBarGauge: 7, storageMinC: -20, storageMaxC: 50 })
    .expect(201)
  return { s, id: res.body.certificate.id, number: res.body.certificate.number }
}

const correct = (id: number, body: Record<string, unknown>) => qa.agent.post(`/api/certificates/${id}/corrections`).set('x-csrf-token', qa.csrf).send(body)

beforeAll(async () => {
  t = await createTestApp()
  qa = await t.signIn('qa')
  customer = await t.signIn('customer')
})
afterAll(async () => {
  await t.close()
})

describe('a released certificate never changes', () => {
  it('refuses UPDATE and DELETE through raw SQL (database trigger)', async () => {
    const { id } = await released()
    const conn = t.orm.em.fork().getConnection()
    await expect(conn.execute('update certificates set valid_until = ? where id = ?', ['2099-12-31', id])).rejects.toThrow(/immutable/)
    await expect(conn.execute('delete from certificates where id = ?', [id])).rejects.toThrow(/immutable/)
    const row = await t.orm.em.fork().findOneOrFail(CertificateSchema, id)
    expect(row.validUntil).not.toBe('2099-12-31')
  })
})

describe('corrections are new revisions', () => {
  it('issues revision 2 naming revision 1; revision 1 stays downloadable, marked superseded', async () => {
    const { id, number } = await released()
    const mails = t.sentMail.length
    const corrected = structuredClone(GOOD)
    corrected.results[1].value = 502 // a copying error in the CO value
    const res = await correct(id, { password: DEMO_PASSWORD, reason: 'CO value mistyped: 502 µmol/mol, not 498', results: corrected.results }).expect(201)
    const rev2 = res.body.certificate
    expect(rev2).toMatchObject({ number, revision: 2, replacesId: id, current: true, correctionReason: 'CO value mistyped: 502 µmol/mol, not 498' })
    expect(rev2.id).not.toBe(id)

    const detail = await qa.agent.get(`/api/certificates/${id}`).expect(200)
    expect(detail.body).toMatchObject({ revision: 1, current: false, supersededById: rev2.id, supersededByRevision: 2 })
    expect(detail.body.revisions.map((r: { revision: number }) => r.revision)).toEqual([1, 2])
    // revision 1's frozen content is untouched
    expect(detail.body.content.composition.find((c: { gas: string }) => c.gas === 'carbon-monoxide').valueText).toBe('498.0')
    const d2 = await qa.agent.get(`/api/certificates/${rev2.id}`).expect(200)
    expect(d2.body.content.composition.find((c: { gas: string }) => c.gas === 'carbon-monoxide').valueText).toBe('502.0')
    expect(d2.body.content.correction).toEqual({ replacesRevision: 1, reason: 'CO value mistyped: 502 µmol/mol, not 498' })
    // the certification date and validity stay those of revision 1
    expect(d2.body.content.dates.certifiedOn).toBe(detail.body.content.dates.certifiedOn)
    expect(d2.body.validUntil).toBe(detail.body.validUntil)

    const pdf2 = pdfText((await qa.agent.get(`/api/certificates/${rev2.id}/pdf`).buffer(true).expect(200)).body).replace(/\s+/g, ' ')
    expect(pdf2).toMatch(/revision 2 replaces revision 1/)
    expect(pdf2).toContain('502.0')
    const pdf1 = pdfText((await qa.agent.get(`/api/certificates/${id}/pdf`).buffer(true).expect(200)).body).replace(/\s+/g, ' ')
    expect(pdf1).toMatch(/SUPERSEDED by revision 2/)
    expect(pdf1).toContain('498.0')

    expect(t.sentMail.length).toBe(mails + 1)
    expect(t.sentMail[mails].subject).toMatch(/rev\. 2/)
  })

  it('corrects only the current revision, needs the password and a reason, and re-checks the values', async () => {
    const { id } = await released()
    await correct(id, { password: DEMO_PASSWORD, reason: 'wrong validity' }).expect(400) // changes nothing
    await correct(id, { password: 'wrong', reason: 'validity should be 12 months', validityMonths: 12 }).expect(403)
    expect(await t.orm.em.fork().count(CertificateSchema, { replacesId: id })).toBe(0)
    const out = structuredClone(GOOD)
    out.results[0].value = 2.5 // +25 %: outside the ±5 % tolerance
    await correct(id, { password: DEMO_PASSWORD, reason: 'CO2 value', results: out.results }).expect(422)
    const ok = await correct(id, { password: DEMO_PASSWORD, reason: 'validity should be 12 months', validityMonths: 12 }).expect(201)
    expect(ok.body.certificate.revision).toBe(2)
    const again = await correct(id, { password: DEMO_PASSWORD, reason: 'another change', validityMonths: 6 }).expect(409)
    expect(again.body.detail).toMatch(/superseded by revision 2/)
    const third = await correct(ok.body.certificate.id, { password: DEMO_PASSWORD, reason: 'storage limit', storageMaxC: 40 }).expect(201)
    expect(third.body.certificate).toMatchObject({ revision: 3, replacesId: ok.body.certificate.id })
  })

  it('is refused to other roles', async () => {
    const { id } = await released()
    const sales = await t.signIn('sales')
    await sales.agent
      .post(`/api/certificates/${id}/corrections`)
      .set('x-csrf-token', sales.csrf)
      .send({ password: DEMO_PASSWORD, reason: 'not mine to do', validityMonths: 6 })
      .expect(403)
  })
})

describe("the customer's documents", () => {
  it('lists their own certificates with every revision, and downloads them', async () => {
    const own = await released('ALDB')
    await correct(own.id, { password: DEMO_PASSWORD, reason: 'validity should be 12 months', validityMonths: 12 }).expect(201)
    const list = await customer.agent.get('/api/certificates').expect(200)
    const mine = list.body.filter((c: { number: string }) => c.number === own.number)
    expect(mine.map((c: { revision: number }) => c.revision).sort()).toEqual([1, 2])
    expect(list.body.every((c: { customerCompany: string }) => c.customerCompany === 'Alderbank Environmental Laboratory')).toBe(true)
    const pdf = await customer.agent.get(`/api/certificates/${own.id}/pdf`).buffer(true).expect(200)
    expect((pdf.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const letter = await customer.agent.get(`/api/certificates/${own.id}/pdf?paper=letter`).buffer(true).expect(200)
    // US Letter is 612 × 792 points (ISO 32000 user space units); A4 is 595.28 × 841.89
    expect((letter.body as Buffer).toString('latin1')).toMatch(/\/MediaBox \[0 0 612 792\]/)
    expect((pdf.body as Buffer).toString('latin1')).toMatch(/\/MediaBox \[0 0 595\.2\d* 841\.8\d*\]/)
    await customer.agent.get(`/api/certificates/${own.id}/pdf?paper=tabloid`).expect(400)
    const current = await customer.agent.get('/api/certificates?current=true').expect(200)
    expect(current.body.filter((c: { number: string }) => c.number === own.number).map((c: { revision: number }) => c.revision)).toEqual([2])
  })

  it("answers 404 for another customer's certificate, its PDF and its listing", async () => {
    const other = await released('BRWS')
    await customer.agent.get(`/api/certificates/${other.id}`).expect(404)
    await customer.agent.get(`/api/certificates/${other.id}/pdf`).expect(404)
    const list = await customer.agent.get('/api/certificates').expect(200)
    expect(list.body.map((c: { id: number }) => c.id)).not.toContain(other.id)
    // staff see it
    await qa.agent.get(`/api/certificates/${other.id}`).expect(200)
  })
})
