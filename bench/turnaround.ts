// Speed of the manager's turnaround API over 100,000 enquiries.
//   npx tsx bench/turnaround.ts [--runs 100]
// Uses perpend_bench (seeded once with `seed.ts --enquiries 100000`) and the built server.
import { ensureBenchData, runsFromArgs, startBenchServer, time } from './support'

const runs = runsFromArgs(100)
const count = await ensureBenchData()
const { base, cookie, stop } = await startBenchServer('manager@corrstone.example')
try {
  const cases = [
    { name: 'last 4 weeks', api: '/api/turnaround?period=4-weeks' },
    { name: 'last 13 weeks', api: '/api/turnaround?period=quarter' },
    { name: 'last 13 weeks, one topic', api: '/api/turnaround?period=quarter&topic=thermal' },
  ]
  console.log(`\nTurnaround API over ${count || 100_000} enquiries, ${runs} sequential requests per case (ms)\n`)
  console.log('case'.padEnd(28), 'answered'.padStart(9), 'p50'.padStart(8), 'p95'.padStart(8))
  for (const c of cases) {
    let answered = 0
    const t = await time(async () => {
      const res = await fetch(`${base}${c.api}`, { headers: { cookie } })
      if (!res.ok) throw new Error(`${c.api} answered ${res.status}`)
      answered = (await res.json()).counts.answered
    }, runs)
    console.log(c.name.padEnd(28), String(answered).padStart(9), t.p50.toFixed(1).padStart(8), t.p95.toFixed(1).padStart(8))
  }
  console.log('\nGoal: p95 under 300 ms.')
}
finally {
  stop()
}
