import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, describe, expect, it } from 'vitest'
import { HttpSession, prepareSchemaFromEntities, removeDir, type ServerProcess, startServer, tempDir } from '../../scripts/lib/server-process.ts'

/**
 * Crash during a fill: the real server (node --import tsx server/index.ts) on a SQLite file, the demo
 * technician records readings on a seeded run through POST /api/runs/:id/readings, the process is killed
 * with SIGKILL while a reading is in flight, and a new process on the same file shows every
 * acknowledged reading, the same session, and lets the run go on to the end. The in-flight reading is
 * retried with its clientRequestId: it is recorded exactly once whether or not it had committed.
 */

const dir = tempDir('crash')
const db = join(dir, 'db.sqlite')
const servers: ServerProcess[] = []
afterAll(async () => {
  for (const s of servers) await s.stop()
  removeDir(dir)
})

interface Step {
  index: number
  kind: string
  cumulativePressure: { value: number }
  cumulativeMass: { value: number } | null
}
interface RunDetail {
  id: number
  status: string
  version: number
  currentStep: number
  stepCount: number
  allStepsDone: boolean
  method: string
  fillTemperature: { value: number }
  steps: Step[]
  readings: { id: number; stepIndex: number; outcome: string }[]
  pendingReplan: unknown
}

/** A reading exactly on the step's target: its absolute pressure at the plan's fill temperature. */
function onTarget(run: RunDetail, requestId: string) {
  const step = run.steps[run.currentStep] as Step
  return {
    stepIndex: run.currentStep,
    pressure: { value: step.cumulativePressure.value, unit: 'bar', reference: 'absolute' },
    temperature: { value: run.fillTemperature.value, unit: 'C' },
    ...(run.method === 'gravimetric' && step.cumulativeMass ? { scaleMass: { value: step.cumulativeMass.value, unit: 'kg' } } : {}),
    clientRequestId: requestId,
    expectedVersion: run.version,
  }
}

describe('SIGKILL during a fill run', () => {
  it('keeps every acknowledged reading, the session, and the run resumes to completion', async () => {
    await prepareSchemaFromEntities(db)
    const first = await startServer({ dbPath: db })
    servers.push(first)
    const tech = new HttpSession(first.url)
    await tech.signIn('technician@demo.test')

    const mine = await tech.request('GET', '/api/runs/mine')
    expect(mine.status).toBe(200)
    const candidates = (mine.body as { id: number; status: string; currentStep: number; stepCount: number }[])
      .filter((r) => (r.status === 'ready' || r.status === 'in-progress') && r.stepCount - r.currentStep >= 2)
      .sort((a, b) => b.stepCount - b.currentStep - (a.stepCount - a.currentStep))
    expect(candidates.length, 'the demo seed books runs for the technician today').toBeGreaterThan(0)
    const runId = (candidates[0] as { id: number }).id

    let run = (await tech.request('GET', `/api/runs/${runId}`)).body as RunDetail
    const seededReadings = run.readings.length
    const acknowledged: number[] = []
    // record all but the last step's reading, keeping one for the crash
    while (run.stepCount - run.currentStep > 1 && acknowledged.length < 3) {
      const r = await tech.request('POST', `/api/runs/${runId}/readings`, onTarget(run, `crash-test-${runId}-${run.currentStep}`))
      expect(r.status, JSON.stringify(r.body)).toBe(201)
      expect(r.body.reading.outcome).toBe('on-target')
      acknowledged.push(r.body.reading.id)
      run = r.body.run
    }
    expect(acknowledged.length).toBeGreaterThan(0)

    // the next reading goes out and the process dies while it is in flight
    const inFlightId = `crash-test-${runId}-${run.currentStep}-inflight`
    const inFlight = onTarget(run, inFlightId)
    const pending = tech.request('POST', `/api/runs/${runId}/readings`, inFlight).catch((e: Error) => ({ status: 0, body: e.message }))
    first.child.kill('SIGKILL')
    const exit = await first.exited
    expect(exit.signal).toBe('SIGKILL')
    const inFlightAnswer = await pending

    // the file is sound after the crash
    const check = new Database(db, { readonly: true })
    expect(check.pragma('integrity_check', { simple: true })).toBe('ok')
    check.close()

    const second = await startServer({ dbPath: db, port: first.port })
    servers.push(second)
    // the session was in the database: the same cookie and CSRF token still work
    const me = await tech.request('GET', '/api/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.email).toBe('technician@demo.test')

    let after = (await tech.request('GET', `/api/runs/${runId}`)).body as RunDetail
    const ids = after.readings.map((r) => r.id)
    for (const id of acknowledged) expect(ids).toContain(id)

    // retry the in-flight reading with the same clientRequestId: recorded exactly once either way
    const retry = await tech.request('POST', `/api/runs/${runId}/readings`, inFlight)
    if (retry.status === 409) {
      // it had committed and the version moved on: the tablet reloads and sees it
      after = (await tech.request('GET', `/api/runs/${runId}`)).body as RunDetail
    } else {
      expect(retry.status, JSON.stringify(retry.body)).toBe(201)
      after = retry.body.run
    }
    const inFlightCommitted = retry.status === 201 ? retry.body.replayed === true : true
    expect(after.readings.length).toBe(seededReadings + acknowledged.length + 1)

    // the run resumes: record the remaining steps and finish it
    while (!after.allStepsDone && after.currentStep < after.stepCount) {
      const r = await tech.request('POST', `/api/runs/${runId}/readings`, onTarget(after, `crash-test-${runId}-${after.currentStep}-after`))
      expect(r.status, JSON.stringify(r.body)).toBe(201)
      after = r.body.run
    }
    const done = await tech.request('POST', `/api/runs/${runId}/complete`, { expectedVersion: after.version })
    expect(done.status, JSON.stringify(done.body)).toBe(200)
    expect(done.body.status).toBe('completed')
    console.info(
      `crash: ${acknowledged.length} acknowledged readings before SIGKILL all present; in-flight reading ${inFlightCommitted ? 'had committed (retry replayed)' : 'had not committed (retry recorded it)'} (answer before the kill: ${inFlightAnswer.status}); run ${runId} completed with ${done.body.readings.length} readings`,
    )
  }, 180_000)
})
