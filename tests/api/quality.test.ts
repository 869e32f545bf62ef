import { existsSync, readdirSync, rmSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CylinderSchema } from '#server/modules/cylinders/cylinder.entity.ts'
import { OrderSchema } from '#server/modules/orders/order.entity.ts'
import { AnalysisSchema, CertificateSchema } from '#server/modules/quality/quality.entity.ts'
import { createQaScenario, minimalPdf, pdfText, type QaScenario } from '#tests/support/qa-scenario.ts'
import { createTestApp, DEMO_PASSWORD, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let qa: SignedInAgent

beforeAll(async () => {
  t = await createTestApp()
  qa = await t.signIn('qa')
})
afterAll(async () => {
  await t.close()
  rmSync(t.deps.uploadDir, { recursive: true, force: true })
})

/** values as QA types them: 2.03 % CO2 and 498 ppm CO, uncertainties well inside the 2 % asked for */
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

function enter(s: QaScenario, body: object = GOOD, i = 0) {
  return qa.agent.put(`/api/quality/runs/${s.runIds[i]}/analysis`).set('x-csrf-token', qa.csrf).send(body)
}

const release = (s: QaScenario, password = DEMO_PASSWORD, i = 0) =>
  qa.agent
    .post(`/api/quality/runs/${s.runIds[i]}/release`)
    .set('x-csrf-token', qa.csrf)
    .send({ password, validityMonths: 24, minimumUsePressureBarGauge: 7, storageMinC: -20, storageMaxC: 50 })

describe('QA queue and access', () => {
  it('lists a completed run as awaiting analysis, and moves it to ready to release when the analysis is within specification', async () => {
    const s = await createQaScenario(t.orm)
    const before = await qa.agent.get('/api/quality/queue').expect(200)
    expect(before.body.awaitingAnalysis.map((i: { runId: number }) => i.runId)).toContain(s.runIds[0])
    await enter(s).expect(200)
    const after = await qa.agent.get('/api/quality/queue').expect(200)
    expect(after.body.readyToRelease.map((i: { runId: number }) => i.runId)).toContain(s.runIds[0])
    expect(after.body.awaitingAnalysis.map((i: { runId: number }) => i.runId)).not.toContain(s.runIds[0])
  })

  it('refuses other roles (403) and signed-out callers (401)', async () => {
    const s = await createQaScenario(t.orm)
    const customer = await t.signIn('customer')
    await customer.agent.get('/api/quality/queue').expect(403)
    const tech = await t.signIn('technician')
    await tech.agent.put(`/api/quality/runs/${s.runIds[0]}/analysis`).set('x-csrf-token', tech.csrf).send(GOOD).expect(403)
    const anon = await t.anonymous()
    await anon.agent.get(`/api/quality/runs/${s.runIds[0]}`).expect(401)
  })

  it('answers 404 for a run that does not exist', async () => {
    await qa.agent.get('/api/quality/runs/999999').expect(404)
  })
})

describe('analysis entry and comparison with the specification', () => {
  it('stores values as mole fractions and works out each deviation on the server', async () => {
    const s = await createQaScenario(t.orm)
    const res = await enter(s).expect(200)
    const stored = await t.orm.em.fork().findOneOrFail(AnalysisSchema, { run: s.runIds[0] })
    const co2 = stored.results.find((r) => r.gas === 'carbon-dioxide')!
    const co = stored.results.find((r) => r.gas === 'carbon-monoxide')!
    // 2.03 % = 0.0203 mol/mol; 498 ppm = 498e-6 mol/mol (unit definitions)
    expect(co2.value).toBeCloseTo(0.0203, 12)
    expect(co2.expandedUncertainty).toBeCloseTo(0.0002, 12)
    expect(co.value).toBeCloseTo(498e-6, 15)
    const rows = res.body.comparison.rows as { gas: string; deviationRelative: number; state: string }[]
    // (2.03 − 2)/2 = +1.5 %; (498 − 500)/500 = −0.4 %: both inside ±5 %
    expect(rows.find((r) => r.gas === 'carbon-dioxide')!.deviationRelative).toBeCloseTo(0.015, 12)
    expect(rows.find((r) => r.gas === 'carbon-monoxide')!.deviationRelative).toBeCloseTo(-0.004, 12)
    expect(rows.every((r) => r.state === 'clear')).toBe(true)
    expect(res.body.analysis.verdict).toBe('within-tolerance')
    expect(res.body.comparison.releasable).toBe(true)
  })

  it('blocks a component outside the blend tolerance and one whose uncertainty is larger than asked', async () => {
    const s = await createQaScenario(t.orm)
    const body = structuredClone(GOOD)
    body.results[0].value = 2.15 // +7.5 % against ±5 %
    body.results[1].expandedUncertainty = 15 // 15/498 = 3.0 % relative against 2 %
    const res = await enter(s, body).expect(200)
    const rows = res.body.comparison.rows as {
      gas: string
      withinTolerance: boolean
      uncertaintyWithinSpec: boolean
      state: string
      deviationRelative: number
    }[]
    const co2 = rows.find((r) => r.gas === 'carbon-dioxide')!
    expect(co2.deviationRelative).toBeCloseTo(0.075, 12)
    expect(co2.withinTolerance).toBe(false)
    expect(co2.state).toBe('blocked')
    const co = rows.find((r) => r.gas === 'carbon-monoxide')!
    expect(co.withinTolerance).toBe(true)
    expect(co.uncertaintyWithinSpec).toBe(false)
    expect(co.state).toBe('blocked')
    expect(res.body.analysis.verdict).toBe('out-of-tolerance')
    // and it cannot be released
    const r = await release(s).expect(422)
    expect(r.body.detail).toMatch(/Not releasable/)
    expect(await t.orm.em.fork().count(CertificateSchema, { analysis: res.body.analysis.id })).toBe(0)
  })

  it('keeps a partly entered analysis pending', async () => {
    const s = await createQaScenario(t.orm)
    const res = await enter(s, { results: [GOOD.results[0]] }).expect(200)
    expect(res.body.analysis.verdict).toBe('pending')
    expect(res.body.comparison.rows.find((r: { gas: string }) => r.gas === 'carbon-monoxide').message).toMatch(/Not entered/)
  })

  it('refuses bad input with problem details naming the field, writing nothing', async () => {
    const s = await createQaScenario(t.orm)
    const negative = await enter(s, { results: [{ ...GOOD.results[0], value: -1 }] }).expect(400)
    expect(negative.body.errors.some((e: { field: string }) => e.field === 'results.0.value')).toBe(true)
    const overOne = await enter(s, { results: [{ ...GOOD.results[0], value: 120 }] }).expect(400)
    expect(overOne.body.errors.some((e: { field: string }) => e.field === 'results.0.value')).toBe(true)
    await enter(s, { results: [{ ...GOOD.results[0], extra: 1 }] }).expect(400)
    const foreign = await enter(s, { results: [{ ...GOOD.results[0], gas: 'helium' }] }).expect(422)
    expect(foreign.body.errors[0].field).toBe('results.0.gas')
    const balance = await enter(s, { results: [{ ...GOOD.results[0], gas: 'nitrogen', value: 97 }] }).expect(422)
    expect(balance.body.errors[0].message).toMatch(/balance/)
    expect(await t.orm.em.fork().count(AnalysisSchema, { run: s.runIds[0] })).toBe(0)
  })
})

describe('analysis report upload', () => {
  const upload = (s: QaScenario, bytes: Buffer, filename: string, contentType: string) =>
    qa.agent.post(`/api/quality/runs/${s.runIds[0]}/report`).set('x-csrf-token', qa.csrf).attach('report', bytes, { filename, contentType })

  const storedFiles = () => {
    const dir = join(t.deps.uploadDir, 'analysis-reports')
    return existsSync(dir) ? readdirSync(dir) : []
  }

  it('accepts a PDF, stores it under a generated name and gives the same bytes back', async () => {
    const s = await createQaScenario(t.orm)
    const pdf = minimalPdf()
    const res = await upload(s, pdf, 'GC run 42.pdf', 'application/pdf').expect(200)
    expect(res.body.analysis.report).toEqual({ originalName: 'GC run 42.pdf', contentType: 'application/pdf', sizeBytes: pdf.length })
    const row = await t.orm.em.fork().findOneOrFail(AnalysisSchema, { run: s.runIds[0] })
    expect(row.reportStoredName).toMatch(/^analysis-reports\/[0-9a-f-]{36}\.pdf$/)
    expect(row.reportStoredName).not.toContain('GC run')
    const back = await qa.agent.get(`/api/quality/runs/${s.runIds[0]}/report`).buffer(true).expect(200)
    expect(Buffer.compare(back.body as Buffer, pdf)).toBe(0)
    expect(back.headers['content-disposition']).toMatch(/attachment/)
  })

  it('accepts a CSV export', async () => {
    const s = await createQaScenario(t.orm)
    const csv = Buffer.from('component,value,unit,U,k\nCO2,2.03,%,0.02,2\nCO,498,ppm,6,2\n')
    const res = await upload(s, csv, 'export.csv', 'text/csv').expect(200)
    expect(res.body.analysis.report.contentType).toBe('text/csv')
  })

  it('refuses an executable renamed .pdf (415), storing nothing', async () => {
    const s = await createQaScenario(t.orm)
    const before = storedFiles().length
    // the first bytes of a Windows executable: "MZ" and the DOS stub
    const exe = Buffer.concat([Buffer.from('MZ\x90\x00\x03\x00\x00\x00\x04\x00\x00\x00\xff\xff', 'latin1'), Buffer.alloc(2048, 0)])
    const res = await upload(s, exe, 'report.pdf', 'application/pdf').expect(415)
    expect(res.body.errors[0].field).toBe('report')
    expect(storedFiles().length).toBe(before)
    expect(await t.orm.em.fork().count(AnalysisSchema, { run: s.runIds[0] })).toBe(0)
  })

  it('refuses a declared type that does not match the file, other extensions, and binary "CSV"', async () => {
    const s = await createQaScenario(t.orm)
    await upload(s, minimalPdf(), 'report.pdf', 'text/csv').expect(415)
    await upload(s, minimalPdf(), 'report.exe', 'application/pdf').expect(415)
    await upload(s, Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 0, 0x2c, 0x0a]), 'sheet.csv', 'text/csv').expect(415)
    await upload(s, Buffer.from('just one column\nno commas here\n'), 'notes.csv', 'text/csv').expect(415)
  })

  it('answers 413 for a file over 10 MB', async () => {
    const s = await createQaScenario(t.orm)
    const big = Buffer.concat([minimalPdf(), Buffer.alloc(10 * 1024 * 1024, 0x20)])
    const res = await upload(s, big, 'big.pdf', 'application/pdf')
    expect(res.status).toBe(413)
    expect(await t.orm.em.fork().count(AnalysisSchema, { run: s.runIds[0] })).toBe(0)
  })

  it('keeps a path-traversal file name as harmless metadata and writes only inside the upload folder', async () => {
    const s = await createQaScenario(t.orm)
    const res = await upload(s, minimalPdf(), '../../../outside-evil.pdf', 'application/pdf').expect(200)
    expect(res.body.analysis.report.originalName).toBe('outside-evil.pdf')
    const row = await t.orm.em.fork().findOneOrFail(AnalysisSchema, { run: s.runIds[0] })
    const full = resolve(t.deps.uploadDir, row.reportStoredName!)
    expect(full.startsWith(resolve(t.deps.uploadDir, 'analysis-reports'))).toBe(true)
    expect(existsSync(full)).toBe(true)
    for (const up of ['..', '../..', '../../..']) expect(existsSync(resolve(t.deps.uploadDir, 'analysis-reports', up, 'outside-evil.pdf'))).toBe(false)
  })

  it('requires the file and refuses unknown roles', async () => {
    const s = await createQaScenario(t.orm)
    await qa.agent.post(`/api/quality/runs/${s.runIds[0]}/report`).set('x-csrf-token', qa.csrf).field('x', 'y').expect(400)
    await qa.agent.post(`/api/quality/runs/${s.runIds[0]}/report`).set('x-csrf-token', qa.csrf).expect(400)
    const sales = await t.signIn('sales')
    await sales.agent
      .post(`/api/quality/runs/${s.runIds[0]}/report`)
      .set('x-csrf-token', sales.csrf)
      .attach('report', minimalPdf(), { filename: 'a.pdf', contentType: 'application/pdf' })
      .expect(403)
  })
})

describe('release', () => {
  it('refuses a wrong password (403) and writes nothing', async () => {
    const s = await createQaScenario(t.orm)
    await enter(s).expect(200)
    const mails = t.sentMail.length
    const res = await release(s, 'not-the-password').expect(403)
    expect(res.body.errors[0].field).toBe('password')
    const em = t.orm.em.fork()
    expect(await em.count(CertificateSchema, { orderLine: s.lineId })).toBe(0)
    expect((await em.findOneOrFail(AnalysisSchema, { run: s.runIds[0] })).verdict).toBe('within-tolerance')
    expect((await em.findOneOrFail(OrderSchema, s.orderId)).status).toBe('analysis')
    expect(t.sentMail.length).toBe(mails)
  })

  it('releases with the signer password: certificate revision 1, PDF e-mailed, cylinder full, order certified', async () => {
    const s = await createQaScenario(t.orm)
    await enter(s).expect(200)
    const mails = t.sentMail.length
    const res = await release(s).expect(201)
    expect(res.body.certificate.revision).toBe(1)
    expect(res.body.certificate.number).toMatch(/^FWC-\d{4}-\d{5}$/)
    expect(res.body.certificate.current).toBe(true)
    expect(res.body.emailed).toBe(true)
    expect(res.body.orderReleased).toBe(true)
    const em = t.orm.em.fork()
    expect((await em.findOneOrFail(OrderSchema, s.orderId)).status).toBe('released')
    expect((await em.findOneOrFail(CylinderSchema, s.cylinderIds[0])).status).toBe('full')
    expect((await em.findOneOrFail(AnalysisSchema, { run: s.runIds[0] })).verdict).toBe('released')

    const mail = t.sentMail[mails]
    expect(mail.to).toBe('customer@demo.test')
    expect(mail.attachments?.[0].contentType).toBe('application/pdf')
    expect(mail.attachments?.[0].content.subarray(0, 5).toString('latin1')).toBe('%PDF-')

    const cert = await em.findOneOrFail(CertificateSchema, res.body.certificate.id)
    const content = cert.content as { composition: { gas: string; valueText: string; uncertaintyText: string }[]; signatory: { name: string } }
    // U rounded to two significant digits, the value to the same digit (GUM 7.2.6): 2.030 ± 0.020 %; 498.0 ± 6.0 µmol/mol
    expect(content.composition.find((c) => c.gas === 'carbon-dioxide')).toMatchObject({ valueText: '2.030', uncertaintyText: '0.020' })
    expect(content.composition.find((c) => c.gas === 'carbon-monoxide')).toMatchObject({ valueText: '498.0', uncertaintyText: '6.0' })
    expect(content.signatory.name).toBe('Ruth Ashdown')

    // the run leaves the QA queue
    const queue = await qa.agent.get('/api/quality/queue').expect(200)
    expect([...queue.body.awaitingAnalysis, ...queue.body.readyToRelease].map((i: { runId: number }) => i.runId)).not.toContain(s.runIds[0])
    // a second release of the same analysis is refused
    await release(s).expect(409)
  })

  it('prints what ISO 6141 asks on the PDF: composition with U and coverage factor, methods, traceability, dates, signatory, hazard', async () => {
    const s = await createQaScenario(t.orm)
    await enter(s).expect(200)
    const res = await release(s).expect(201)
    const pdf = await qa.agent.get(`/api/certificates/${res.body.certificate.id}/pdf`).buffer(true).expect(200)
    expect(pdf.headers['content-type']).toMatch(/application\/pdf/)
    const bytes = pdf.body as Buffer
    expect(bytes.subarray(0, 4).toString('latin1')).toBe('%PDF')
    const text = pdfText(bytes).replace(/\s+/g, ' ')
    expect(text).toContain(res.body.certificate.number)
    expect(text).toMatch(/expanded uncertainty U is the combined standard uncertainty multiplied by the coverage factor k \(k = 2\)/)
    expect(text).toContain('2.030')
    expect(text).toContain('0.020')
    expect(text).toContain(`KR-T10-${process.pid % 10000}-`) // cylinder serial
    expect(text).toMatch(/Water volume 10 L/)
    expect(text).toMatch(/150 bar \(gauge\) at 15 °C/)
    expect(text).toMatch(/Gravimetric \(ISO 6142-1\)/)
    expect(text).toMatch(/traceable to the SI/)
    expect(text).toMatch(/Valid until \d{4}-\d{2}-\d{2}/)
    expect(text).toMatch(/Ruth Ashdown/)
    expect(text).toMatch(/may explode if heated/)
    expect(text).toMatch(/Toxic|toxic/) // carbon monoxide
    expect(text).toMatch(/Page 1 of \d/)
  })

  it('moves the order to certified only when every cylinder of it is released', async () => {
    const s = await createQaScenario(t.orm, { cylinders: 2 })
    await enter(s, GOOD, 0).expect(200)
    await enter(s, GOOD, 1).expect(200)
    const first = await release(s, DEMO_PASSWORD, 0).expect(201)
    expect(first.body.orderReleased).toBe(false)
    expect((await t.orm.em.fork().findOneOrFail(OrderSchema, s.orderId)).status).toBe('analysis')
    const second = await release(s, DEMO_PASSWORD, 1).expect(201)
    expect(second.body.orderReleased).toBe(true)
    expect((await t.orm.em.fork().findOneOrFail(OrderSchema, s.orderId)).status).toBe('released')
    expect(second.body.certificate.number).not.toBe(first.body.certificate.number)
  })

  it('serves a draft preview marked as not valid', async () => {
    const s = await createQaScenario(t.orm)
    await qa.agent.get(`/api/quality/runs/${s.runIds[0]}/certificate-preview`).expect(409)
    await enter(s).expect(200)
    const res = await qa.agent.get(`/api/quality/runs/${s.runIds[0]}/certificate-preview?validityMonths=6`).buffer(true).expect(200)
    const text = pdfText(res.body as Buffer).replace(/\s+/g, ' ')
    expect(text).toMatch(/DRAFT FOR REVIEW/)
    expect(await t.orm.em.fork().count(CertificateSchema, { orderLine: s.lineId })).toBe(0)
  })
})

describe('signature attempts', () => {
  it('answers 429 after five wrong signature passwords, even to the right one', async () => {
    const fresh = await createTestApp()
    try {
      const signer = await fresh.signIn('qa')
      const s = await createQaScenario(fresh.orm)
      await signer.agent.put(`/api/quality/runs/${s.runIds[0]}/analysis`).set('x-csrf-token', signer.csrf).send(GOOD).expect(200)
      const attempt = (password: string) =>
        signer.agent
          .post(`/api/quality/runs/${s.runIds[0]}/release`)
          .set('x-csrf-token', signer.csrf)
          .send({ password, validityMonths: 24, minimumUsePressureBarGauge: 7, storageMinC: -20, storageMaxC: 50 })
      for (let i = 0; i < 5; i++) await attempt(`wrong-${i}`).expect(403)
      await attempt(DEMO_PASSWORD).expect(429)
      expect(await fresh.orm.em.fork().count(CertificateSchema, {})).toBe(0)
    } finally {
      await fresh.close()
    }
  })
})

describe('reject for rework', () => {
  it('closes the analysis with the reason and holds the cylinder in quarantine', async () => {
    const s = await createQaScenario(t.orm)
    await enter(s).expect(200)
    await qa.agent.post(`/api/quality/runs/${s.runIds[0]}/reject`).set('x-csrf-token', qa.csrf).send({ reason: 'no' }).expect(400)
    const res = await qa.agent
      .post(`/api/quality/runs/${s.runIds[0]}/reject`)
      .set('x-csrf-token', qa.csrf)
      .send({ reason: 'CO reading drifts: homogenise again and re-analyse' })
      .expect(200)
    expect(res.body.analysis.verdict).toBe('rejected')
    expect(res.body.analysis.rejectReason).toMatch(/homogenise/)
    const cyl = await t.orm.em.fork().findOneOrFail(CylinderSchema, s.cylinderIds[0])
    expect(cyl.status).toBe('quarantine')
    expect(cyl.notes).toMatch(/homogenise/)
    await enter(s).expect(409)
    await release(s).expect(409)
    const queue = await qa.agent.get('/api/quality/queue').expect(200)
    expect(queue.body.awaitingAnalysis.map((i: { runId: number }) => i.runId)).not.toContain(s.runIds[0])
  })
})

describe('OpenAPI', () => {
  it('describes the QA and certificate operations with their roles', async () => {
    const doc = (await qa.agent.get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { 'x-roles': string[] }>> }
    expect(doc.paths['/api/quality/runs/{runId}/release'].post['x-roles']).toEqual(['qa'])
    expect(doc.paths['/api/quality/runs/{runId}/report'].post['x-roles']).toEqual(['qa'])
    expect(doc.paths['/api/certificates/{id}/pdf'].get['x-roles']).toContain('customer')
  })
})
