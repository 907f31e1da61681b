// The invented demo scenario: the supplier, its customers, their people, projects and a few enquiries.
// Idempotent: every record is found by its natural key first, so running it twice changes nothing.
//   tsx scripts/seed.ts                  seed the database named by NUXT_DB_*
//   tsx scripts/seed.ts --print-accounts print the demo sign-ins (one per line)
//   tsx scripts/seed.ts --print-password print the shared demo password
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { createSequelize, dbOptionsFromEnv } from '../server/database/connect'
import { Enquiry, initModels, Organisation, Project, User } from '../server/models'
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
    for (const e of enquiries) {
      const requester = userIds.get(e.requester)!
      const receivedAt = new Date(Date.now() - e.daysAgo * 86_400_000)
      await Enquiry.findOrCreate({
        where: { refYear: year, refSeq: e.seq },
        defaults: {
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
          requesterOrganisation: null,
          organisationId: requester.organisationId,
          projectId: projectIds.get(e.project)!,
          assigneeId: ['received', 'triaged'].includes(e.status) ? null : officer.id,
          receivedAt,
          firstResponseAt: ['waiting_on_requester', 'answered', 'closed'].includes(e.status) ? new Date(receivedAt.getTime() + 86_400_000) : null,
          answeredAt: ['answered', 'closed'].includes(e.status) ? new Date(receivedAt.getTime() + 2 * 86_400_000) : null,
          closedAt: e.status === 'closed' ? new Date(receivedAt.getTime() + 4 * 86_400_000) : null,
        },
      })
    }
    console.log(`Demo data in place: ${organisations.length} organisations, ${demoAccounts.length} people, ${projects.length} projects, ${enquiries.length} enquiries`)
  }
  finally {
    await sequelize.close()
  }
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
