/**
 * Micro-benchmark timing: warm up, calibrate a batch size that runs for about `batchMs`, then time `samples`
 * batches. Each batch is timed on the process CPU clock (process.cpuUsage: user + system), not the wall clock, so
 * time the process spends waiting for a core on a busy machine does not count; the fastest batch is reported
 * (the least disturbed one), with the wall-clock median beside it.
 */

export interface MicroOptions {
  /** time of one timed batch, ms (default 40) */
  batchMs?: number
  /** timed batches (default 9) */
  samples?: number
  /** untimed warm-up time, ms (default 150) */
  warmupMs?: number
}

export interface MicroResult {
  /** CPU nanoseconds per call, fastest batch */
  nsPerOp: number
  /** wall-clock nanoseconds per call, median batch */
  wallMedianNsPerOp: number
  /** calls per batch */
  batch: number
}

function cpuMicros(): number {
  const u = process.cpuUsage()
  return u.user + u.system
}

/** `fn(i)` is called with a running counter so the caller can vary inputs; it must return a number (kept live). */
export function measure(fn: (i: number) => number, options: MicroOptions = {}): MicroResult {
  const batchMs = options.batchMs ?? 40
  const samples = options.samples ?? 9
  const warmupMs = options.warmupMs ?? 150
  let sink = 0
  let i = 0
  // warm-up and calibration
  let batch = 1
  const warmupEnd = performance.now() + warmupMs
  for (;;) {
    const t0 = performance.now()
    for (let k = 0; k < batch; k++) sink += fn(i++)
    const elapsed = performance.now() - t0
    if (elapsed >= batchMs / 4 && performance.now() >= warmupEnd) {
      batch = Math.max(1, Math.round((batch * batchMs) / elapsed))
      break
    }
    if (elapsed < batchMs / 4) batch *= 2
  }
  const cpu: number[] = []
  const wall: number[] = []
  for (let s = 0; s < samples; s++) {
    const c0 = cpuMicros()
    const t0 = process.hrtime.bigint()
    for (let k = 0; k < batch; k++) sink += fn(i++)
    wall.push(Number(process.hrtime.bigint() - t0) / batch)
    cpu.push(((cpuMicros() - c0) * 1000) / batch)
  }
  if (!Number.isFinite(sink)) throw new Error('benchmarked function returned a non-finite value')
  wall.sort((a, b) => a - b)
  return { nsPerOp: Math.min(...cpu), wallMedianNsPerOp: wall[Math.floor(wall.length / 2)], batch }
}

/** Median and percentiles of a list of durations. */
export function summarise(values: readonly number[]): { median: number; p95: number; p99: number; min: number; max: number } {
  const v = [...values].sort((a, b) => a - b)
  const at = (q: number) => v[Math.min(v.length - 1, Math.floor(q * v.length))]
  return { median: at(0.5), p95: at(0.95), p99: at(0.99), min: v[0], max: v[v.length - 1] }
}
