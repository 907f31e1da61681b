// The invented demo scenario: the supplier, its customers, their people, projects and a few enquiries.
// Idempotent: every record is found by its natural key first, so running it twice changes nothing.
//   tsx scripts/seed.ts                  seed the database named by NUXT_DB_*
//   tsx scripts/seed.ts --print-accounts print the demo sign-ins (one per line)
//   tsx scripts/seed.ts --print-password print the shared demo password
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { createSequelize, dbOptionsFromEnv } from '../server/database/connect'
import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import type { Sequelize } from 'sequelize'
import { Enquiry, EnquiryEvent, EnquiryMessage, initModels, Organisation, Project, User } from '../server/models'
import { computeDueTimes, pausesFromEvents } from '../server/utils/desk-clock'
import type { ServiceTargetPolicy } from '../shared/time/working-time'
import { enquiryStatuses, enquiryTopics } from '../shared/types/enquiry'
import type { Role } from '../shared/types/roles'

// Same scrypt defaults as nuxt-auth-utils' hashPassword, so these hashes verify at sign-in.
const hash = new Hash(new Scrypt({}))

export const DEMO_PASSWORD = 'corrstone-demo-2026'

const organisations = [
  { name: 'Corrstone Building Systems Ltd', kind: 'supplier' },
  { name: 'Halloran Reid Architects', kind: 'architect' },
  { name: 'Brightwater Design Partnership', kind: 'architect' },
  { name: 'Keel Structural', kind: 'engineer' },
  { name: 'Kestrel Homes', kind: 'builder' },
] as const

type OrgName = typeof organisations[number]['name']

export const demoAccounts: { email: string, name: string, role: Role, organisation: OrgName }[] = [
  { email: 'admin@corrstone.example', name: 'Ada Mulcahy', role: 'admin', organisation: 'Corrstone Building Systems Ltd' },
  { email: 'manager@corrstone.example', name: 'Declan Furlong', role: 'manager', organisation: 'Corrstone Building Systems Ltd' },
  { email: 'officer@corrstone.example', name: 'Niamh Brennan', role: 'officer', organisation: 'Corrstone Building Systems Ltd' },
  { email: 'officer2@corrstone.example', name: 'Tomás Whelan', role: 'officer', organisation: 'Corrstone Building Systems Ltd' },
  { email: 'architect@hallorans.example', name: 'Orla Halloran', role: 'specifier', organisation: 'Halloran Reid Architects' },
  { email: 'architect@brightwater.example', name: 'Ciarán Dunne', role: 'specifier', organisation: 'Brightwater Design Partnership' },
  { email: 'engineer@keel.example', name: 'Maeve Keane', role: 'specifier', organisation: 'Keel Structural' },
  { email: 'builder@kestrel.example', name: 'Pádraig Lynch', role: 'specifier', organisation: 'Kestrel Homes' },
]

const projects = [
  { name: 'Glenmore Terrace', organisation: 'Halloran Reid Architects', siteAddress: 'Glenmore Road, Fermoy', region: 'Cork', stage: 'tender', buildingType: 'Terraced houses (12 two-storey)', storeys: 2, wallAreaM2: 1850 },
  { name: 'Riverside school extension', organisation: 'Brightwater Design Partnership', siteAddress: 'Mill Lane, Carlow', region: 'Carlow', stage: 'planning', buildingType: 'School extension', storeys: 2, wallAreaM2: 940 },
  { name: 'Quay Street apartments', organisation: 'Keel Structural', siteAddress: 'Quay Street, Galway', region: 'Galway', stage: 'construction', buildingType: 'Apartments (5 storeys)', storeys: 5, wallAreaM2: 3200 },
] as const

const enquiries = [
  { seq: 1, project: 'Glenmore Terrace', requester: 'architect@hallorans.example', topic: 'thermal', status: 'received', priority: 'normal', daysAgo: 1, subject: 'Insulation thickness for U = 0.18 on the terrace', question: 'We plan 215 mm blocks with the Corrstone system. What EPS thickness reaches **U = 0.18 W/m²K**, and does graphite EPS let us go thinner?' },
  { seq: 2, project: 'Riverside school extension', requester: 'architect@brightwater.example', topic: 'moisture', status: 'in_hand', priority: 'normal', daysAgo: 3, subject: 'Condensation risk at the sports hall wall', question: 'The sports hall has high humidity at times. Is there an interstitial condensation risk with the external insulation and a silicone render?' },
  { seq: 3, project: 'Quay Street apartments', requester: 'engineer@keel.example', topic: 'wind', status: 'waiting_on_requester', priority: 'normal', daysAgo: 6, subject: 'Anchor pattern at the fifth-floor corners', question: 'Exposed quayside site, terrain category II. How many anchors per m² in the edge zones at roof level?' },
  { seq: 4, project: 'Quay Street apartments', requester: 'engineer@keel.example', topic: 'fire', status: 'answered', priority: 'normal', daysAgo: 12, subject: 'Fire barriers at floor lines', question: 'Which reaction-to-fire classes apply to the EPS system on a 5-storey block, and where do the fire barriers go?' },
  { seq: 5, project: 'Glenmore Terrace', requester: 'builder@kestrel.example', topic: 'site_practice', status: 'closed', priority: 'normal', daysAgo: 20, subject: 'Laying in cold weather', question: 'What is the lowest temperature at which the thin-layer mortar can be used, and how should fresh work be protected?' },
  { seq: 6, project: 'Glenmore Terrace', requester: 'builder@kestrel.example', topic: 'structure', status: 'triaged', priority: 'urgent', daysAgo: 0, subject: 'Site stopped: lintel bearing on 100 mm block', question: 'Our bricklayers have stopped at plot 7. Can a 100 mm block take the lintel bearing at the kitchen opening?' },
] as const

async function seed() {
  const sequelize = createSequelize(dbOptionsFromEnv())
  initModels(sequelize)
  try {
    const orgIds = new Map<string, number>()
    for (const org of organisations) {
      const [row] = await Organisation.findOrCreate({ where: { name: org.name }, defaults: { name: org.name, kind: org.kind } })
      orgIds.set(org.name, row.id)
    }
    const passwordHash = await hash.make(DEMO_PASSWORD)
    const userIds = new Map<string, User>()
    for (const account of demoAccounts) {
      const [row] = await User.findOrCreate({
        where: { email: account.email },
        defaults: {
          email: account.email,
          name: account.name,
          role: account.role,
          organisationId: orgIds.get(account.organisation)!,
          passwordHash,
          phone: null,
          emailVerifiedAt: new Date(),
          deactivatedAt: null,
          lastSignInAt: null,
        },
      })
      userIds.set(account.email, row)
    }
    const projectIds = new Map<string, number>()
    for (const p of projects) {
      const [row] = await Project.findOrCreate({
        where: { name: p.name },
        defaults: {
          name: p.name,
          siteAddress: p.siteAddress,
          region: p.region,
          stage: p.stage,
          buildingType: p.buildingType,
          storeys: p.storeys,
          wallAreaM2: p.wallAreaM2,
          organisationId: orgIds.get(p.organisation)!,
        },
      })
      projectIds.set(p.name, row.id)
    }
    const year = new Date().getUTCFullYear()
    const officer = userIds.get('officer@corrstone.example')!
    const targets = await loadTargets(sequelize)
    for (const e of enquiries) {
      const requester = userIds.get(e.requester)!
      // Received during the working day, a few working days back, so the clocks show sensible figures.
      const receivedAt = atNineThirty(Date.now() - e.daysAgo * 86_400_000)
      const existing = await Enquiry.findOne({ where: { refYear: year, refSeq: e.seq } })
      if (existing) continue
      const steps = lifeOf(e.status, receivedAt)
      const responded = steps.find(s => ['waiting_on_requester', 'answered'].includes(s.to))?.at ?? null
      const answered = steps.find(s => s.to === 'answered')?.at ?? null
      const closed = steps.find(s => s.to === 'closed')?.at ?? null
      const fields = {
        receivedAt, priority: e.priority as string, status: e.status as string, firstResponseAt: responded, answeredAt: answered,
      }
      const due = computeDueTimes(fields as never, pausesFromEvents(steps.map(st => ({ kind: 'status' as const, fromValue: st.from, toValue: st.to, createdAt: st.at }))), targets)
      const row = await Enquiry.create({
        ref: `TQ-${year}-${String(e.seq).padStart(4, '0')}`,
        refYear: year,
        refSeq: e.seq,
        status: e.status,
        topic: e.topic,
        priority: e.priority,
        subject: e.subject,
        question: e.question,
        requesterUserId: requester.id,
        requesterName: requester.name,
        requesterEmail: requester.email,
        requesterPhone: null,
        requesterOrganisation: organisationOf(requester, orgIds),
        organisationId: requester.organisationId,
        projectId: projectIds.get(e.project)!,
        assigneeId: ['received', 'triaged'].includes(e.status) ? null : officer.id,
        receivedAt,
        firstResponseAt: responded,
        answeredAt: answered,
        closedAt: closed,
        mergedIntoId: null,
        replyToken: randomBytes(16).toString('hex'),
        lastActivityAt: steps.at(-1)!.at,
        ...due,
      })
      await EnquiryEvent.bulkCreate(steps.map(st => ({ enquiryId: row.id, actorUserId: st.from ? officer.id : requester.id, kind: 'status' as const, fromValue: st.from, toValue: st.to, createdAt: st.at })))
      if (responded) {
        await EnquiryMessage.create({ enquiryId: row.id, kind: 'reply', authorUserId: officer.id, authorName: officer.name, body: e.status === 'waiting_on_requester' ? 'Thank you. Could you send the elevation drawings with the building height and the distance to the sea shore? Then we can size the anchor pattern per zone.' : 'Please find our answer below. This is demo text for an invented enquiry.', createdAt: responded })
      }
      if (e.status !== 'received') {
        await EnquiryMessage.create({ enquiryId: row.id, kind: 'note', authorUserId: officer.id, authorName: officer.name, body: 'Internal: check against the current detail revision before replying.', createdAt: new Date(receivedAt.getTime() + 3_600_000) })
      }
    }
    const bulk = Number(process.argv[process.argv.indexOf('--enquiries') + 1])
    if (process.argv.includes('--enquiries')) {
      if (!Number.isInteger(bulk) || bulk < 1 || bulk > 1_000_000) throw new Error('--enquiries takes a whole number from 1 to 1,000,000')
      await seedBulk(sequelize, bulk, { orgIds, projectIds, userIds, targets })
    }
    // The counter continues after the highest reference in the table, however it got there.
    await sequelize.query(
      'INSERT INTO reference_counters (year, last_seq) SELECT ref_year, MAX(ref_seq) FROM enquiries GROUP BY ref_year ON DUPLICATE KEY UPDATE last_seq = GREATEST(last_seq, VALUES(last_seq))',
      { type: QueryTypes.INSERT },
    )
    console.log(`Demo data in place: ${organisations.length} organisations, ${demoAccounts.length} people, ${projects.length} projects, ${enquiries.length} enquiries`)
  }
  finally {
    await sequelize.close()
  }
}

interface Step { from: string | null, to: string, at: Date }

/** The status events that bring a new enquiry to `status`, spaced out as a desk would. */
function lifeOf(status: string, receivedAt: Date): Step[] {
  const t = (hours: number) => new Date(receivedAt.getTime() + hours * 3_600_000)
  const paths: Record<string, [string, number][]> = {
    received: [],
    triaged: [['triaged', 1]],
    in_hand: [['in_hand', 2]],
    waiting_on_requester: [['in_hand', 2], ['waiting_on_requester', 24]],
    answered: [['in_hand', 2], ['answered', 48]],
    closed: [['in_hand', 2], ['answered', 48], ['closed', 96]],
    reopened: [['in_hand', 2], ['answered', 48], ['reopened', 72]],
  }
  const steps: Step[] = [{ from: null, to: 'received', at: receivedAt }]
  for (const [to, hours] of paths[status] ?? []) steps.push({ from: steps.at(-1)!.to, to, at: t(hours) })
  return steps
}

function atNineThirty(ms: number): Date {
  const d = new Date(ms)
  d.setUTCHours(9, 30, 0, 0)
  // Never in the future, and on a working day (weekends move back to Friday).
  if (d.getTime() > Date.now()) d.setUTCDate(d.getUTCDate() - 1)
  while (d.getUTCDay() === 0 || d.getUTCDay() === 6) d.setUTCDate(d.getUTCDate() - 1)
  return d
}

function organisationOf(user: User, orgIds: Map<string, number>): string | null {
  for (const [name, id] of orgIds) if (id === user.organisationId) return name
  return null
}

async function loadTargets(sequelize: Sequelize): Promise<ServiceTargetPolicy> {
  const rows = await sequelize.query<{ priority: 'normal' | 'urgent', first_response_minutes: number, answer_minutes: number }>(
    'SELECT priority, first_response_minutes, answer_minutes FROM service_targets', { type: QueryTypes.SELECT })
  const policy = { normal: { firstResponseMs: 0, answerMs: 0 }, urgent: { firstResponseMs: 0, answerMs: 0 } }
  for (const r of rows) policy[r.priority] = { firstResponseMs: r.first_response_minutes * 60_000, answerMs: r.answer_minutes * 60_000 }
  return policy
}

/** A deterministic pseudo-random sequence (mulberry32), so a large demo set is the same on every machine. */
function random(seed: number) {
  return () => {
    seed |= 0
    seed = (seed + 0x6D2B79F5) | 0
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/**
 * A large invented set for load and speed checks (`--enquiries 100000`): spread over the last two years,
 * every status, topic and priority, inserted in chunks with their status events.
 */
async function seedBulk(sequelize: Sequelize, count: number, ctx: { orgIds: Map<string, number>, projectIds: Map<string, number>, userIds: Map<string, User>, targets: ServiceTargetPolicy }) {
  const rand = random(20261202)
  const pick = <T>(items: readonly T[]) => items[Math.floor(rand() * items.length)]!
  const specifiers = [...ctx.userIds.values()].filter(u => u.role === 'specifier')
  const staff = [...ctx.userIds.values()].filter(u => u.role !== 'specifier')
  const projects = [...ctx.projectIds.values()]
  const [{ n: already }] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM enquiries WHERE subject LIKE \'Bulk demo enquiry%\'', { type: QueryTypes.SELECT }) as [{ n: number }]
  if (Number(already) >= count) {
    console.log(`Bulk demo set already holds ${already} enquiries`)
    return
  }
  const counters = new Map<number, number>()
  const maxima = await sequelize.query<{ y: number, s: number }>('SELECT ref_year AS y, MAX(ref_seq) AS s FROM enquiries GROUP BY ref_year', { type: QueryTypes.SELECT })
  for (const m of maxima) counters.set(Number(m.y), Number(m.s))
  const now = Date.now()
  const chunk = 2000
  const subjects = ['U-value for the terrace walls', 'Anchor pattern near the corners', 'Condensation at the pool hall', 'Window jamb detail', 'Fire barrier positions', 'Blocks and mortar for plot 4', 'Lintel bearing on 100 mm block', 'Render colour and sd value']
  for (let done = Number(already); done < count; done += chunk) {
    const rows: Record<string, unknown>[] = []
    const lives: Step[][] = []
    for (let i = done; i < Math.min(count, done + chunk); i++) {
      const receivedAt = atNineThirty(now - Math.floor(rand() * 730) * 86_400_000)
      const ageDays = (now - receivedAt.getTime()) / 86_400_000
      const status = ageDays > 30 ? (rand() < 0.85 ? 'closed' : 'answered') : pick(enquiryStatuses)
      const year = receivedAt.getUTCFullYear()
      const seq = (counters.get(year) ?? 0) + 1
      counters.set(year, seq)
      const requester = pick(specifiers)
      const priority = rand() < 0.08 ? 'urgent' : 'normal'
      const steps = lifeOf(status, receivedAt)
      const responded = steps.find(s => ['waiting_on_requester', 'answered'].includes(s.to))?.at ?? null
      const answered = steps.find(s => s.to === 'answered')?.at ?? null
      const due = computeDueTimes({ receivedAt, priority, status, firstResponseAt: responded, answeredAt: answered } as never,
        pausesFromEvents(steps.map(st => ({ kind: 'status' as const, fromValue: st.from, toValue: st.to, createdAt: st.at }))), ctx.targets)
      lives.push(steps)
      rows.push({
        ref: `TQ-${year}-${String(seq).padStart(4, '0')}`, ref_year: year, ref_seq: seq, status, topic: pick(enquiryTopics), priority,
        subject: `Bulk demo enquiry ${i + 1}: ${pick(subjects)}`, question: 'Invented question text for the large demonstration set.',
        requester_user_id: requester.id, requester_name: requester.name, requester_email: requester.email, requester_phone: null,
        requester_organisation: organisationOf(requester, ctx.orgIds), organisation_id: requester.organisationId, project_id: pick(projects),
        assignee_id: ['received', 'triaged'].includes(status) ? null : pick(staff).id, received_at: receivedAt,
        first_response_at: responded, answered_at: answered, closed_at: steps.find(s => s.to === 'closed')?.at ?? null,
        merged_into_id: null, reply_token: randomBytes(16).toString('hex'),
        first_response_due_at: due.firstResponseDueAt, answer_due_at: due.answerDueAt, next_due_at: due.nextDueAt, waiting_since: due.waitingSince,
        // The large set's waits count as already reminded, so a demo server does not mail hundreds at once.
        reminded_at: due.waitingSince ? new Date(Math.min(now, due.waitingSince.getTime() + 7 * 86_400_000)) : null,
        first_response_working_ms: due.firstResponseWorkingMs, answer_working_ms: due.answerWorkingMs,
        last_activity_at: steps.at(-1)!.at, created_at: receivedAt, updated_at: steps.at(-1)!.at,
      })
    }
    await sequelize.transaction(async (transaction) => {
      await sequelize.getQueryInterface().bulkInsert('enquiries', rows, { transaction })
      const ids = await sequelize.query<{ id: number, ref: string }>('SELECT id, ref FROM enquiries WHERE ref IN (:refs)', { replacements: { refs: rows.map(r => r.ref) }, type: QueryTypes.SELECT, transaction })
      const idOf = new Map(ids.map(r => [r.ref, r.id]))
      const events = rows.flatMap((r, k) => lives[k]!.map(st => ({ enquiry_id: idOf.get(r.ref as string), actor_user_id: r.assignee_id ?? null, kind: 'status', from_value: st.from, to_value: st.to, created_at: st.at })))
      await sequelize.getQueryInterface().bulkInsert('enquiry_events', events, { transaction })
    })
    process.stdout.write(`\r  bulk demo enquiries: ${Math.min(count, done + chunk)} / ${count}`)
  }
  process.stdout.write('\n')
}

const arg = process.argv[2]
if (arg === '--print-accounts') {
  for (const a of demoAccounts) console.log(`${a.role.padEnd(9)} ${a.email.padEnd(32)} ${a.name}, ${a.organisation}`)
}
else if (arg === '--print-password') {
  process.stdout.write(DEMO_PASSWORD)
}
else {
  await seed()
}
