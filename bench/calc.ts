/**
 * Timing of the thermal and moisture engine: 10,000 U-value and 1,000 monthly condensation calculations.
 * Run with `npx tsx bench/calc.ts` (add `--expose-gc` through NODE_OPTIONS for a cleaner heap figure).
 */
import { condensationYear, jointFraction, uValue, type UValueInput, type VapourLayer } from '../shared/calc/index'

function stats(samples: number[]) {
  const sorted = [...samples].sort((a, b) => a - b)
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!
  return { mean: samples.reduce((s, x) => s + x, 0) / samples.length, p50: at(0.5), p95: at(0.95) }
}

function collect() {
  (globalThis as { gc?: () => void }).gc?.()
}

function run(label: string, n: number, make: (i: number) => () => unknown) {
  for (let i = 0; i < Math.min(200, n); i++) make(i)() // warm-up so the timings are of optimised code
  collect()
  const heapBefore = process.memoryUsage().heapUsed
  const times = new Array<number>(n)
  let sink = 0
  for (let i = 0; i < n; i++) {
    const call = make(i)
    const t0 = performance.now()
    const out = call()
    times[i] = performance.now() - t0
    if (out) sink++
  }
  const heapAfter = process.memoryUsage().heapUsed
  const s = stats(times)
  const us = (ms: number) => `${(ms * 1000).toFixed(1)} µs`
  console.log(`${label}: ${n} calls, mean ${us(s.mean)}, p50 ${us(s.p50)}, p95 ${us(s.p95)}, total ${times.reduce((a, b) => a + b, 0).toFixed(1)} ms, heap delta ${((heapAfter - heapBefore) / 1024 / 1024).toFixed(2)} MB${sink === n ? '' : ' (some calls returned nothing)'}`)
}

const joints = jointFraction({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3 })
const wallFor = (i: number): UValueInput => ({
  layers: [
    { name: 'Plaster', thickness_mm: 13, lambda: 0.57 },
    { name: 'Block', thickness_mm: 215, lambda: 0.29, bridge: { lambda: 0.83, fraction: joints } },
    { name: 'EPS', thickness_mm: 100 + (i % 150), lambda: 0.031 },
    { name: 'Render', thickness_mm: 6, lambda: 0.8 },
  ],
  fixings: { layerIndex: 2, perM2: 6, diameter_mm: 4, lambda: 50 },
  airGapLevel: 1,
})

const climate = [
  [5.3, 86], [5.4, 84], [6.8, 81], [8.3, 77], [10.9, 76], [13.6, 77],
  [15.4, 79], [15.1, 80], [13.3, 82], [10.6, 85], [7.4, 87], [6.0, 87],
].map(([tempC, rhPercent]) => ({ tempC: tempC!, rhPercent: rhPercent! }))
const vapourWall = (i: number): VapourLayer[] => [
  { thickness_mm: 13, lambda: 0.57, mu: 10 },
  { thickness_mm: 215, lambda: 0.4, mu: 5 },
  { thickness_mm: 100, lambda: 0.036, mu: 1 },
  { resistance: 0.01, sd: 0.5 + (i % 20) * 0.1 },
]

run('uValue (combined method, ΔUf, ΔUg)', 10_000, i => () => uValue(wallFor(i)))
run('condensationYear (monthly Glaser, class 3)', 1_000, i => () => condensationYear({ layers: vapourWall(i), climate, internal: { tempC: 20, humidityClass: 3 } }))
