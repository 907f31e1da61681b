import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import { formatCents } from '../../shared/calc'
import type { CreateQuotationInput } from '../../shared/workbench/quotation'
import { call, currentYear, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { enquiryInHand as inHand } from '../support/enquiries'
import { pdfText } from '../support/pdf'
import { useBuiltServer } from '../support/server'

/**
 * What happens after the first answer: a quotation going out inside a response pack, the waiting-on-you
 * reminder, the mail when an enquiry is closed, and sent library items the library has since moved on from.
 */

const catcher = await startMailCatcher({ port: 0 })

async function rows<T extends object>(sql: string, replacements: unknown[] = []): Promise<T[]> {
  return testDb().query<T>(sql, { replacements, type: QueryTypes.SELECT })
}

const intake = (topic: string, subject: string) => ({
  project: { name: 'Ardmore Quay apartments', region: 'Waterford', stage: 'tender' },
  topic,
  subject,
  question: 'What does the full wall system cost for the north block, and which details apply at the windows?',
  priority: 'normal',
})

const quotation: CreateQuotationInput = {
  scope: 'full-system',
  quantities: {
    area_m2: 420, openings_m2: 70, baseLength_m: 60, openingsCount: 28, openingsPerimeter_m: 150, openingHeads_m: 38,
    externalCorners_m: 42, system: { block: { length_mm: 440, height_mm: 215, thickness_mm: 300 } },
  },
  discountPercent: 0,
  vatPercent: 23,
  validUntil: `${currentYear() + 1}-03-31`,
}

describe('after the first answer', async () => {
  // Reminders after a tenth of a working day, swept every half second, for this server only.
  await useBuiltServer({ NUXT_MAIL_URL: `smtp://127.0.0.1:${catcher.port}`, NUXT_REMINDER_SWEEP_MS: '500', NUXT_REMINDER_WORKING_DAYS: '0.1' })
  let officer = ''
  let manager = ''
  let specA = ''
  beforeAll(async () => {
    [officer, manager, specA] = await Promise.all([signIn(demo.officer), signIn(demo.manager), signIn(demo.specA)])
  })
  afterAll(async () => {
    await testDb().query('DELETE FROM library_overrides WHERE code = ?', { replacements: ['D-WIN-03'], type: QueryTypes.DELETE })
    await catcher.close()
    await closeTestDb()
  })

  /** A new enquiry of specifier A's, taken in hand by the officer. */
  const enquiryInHand = (topic: string, subject: string) => inHand({ specifier: specA, officer }, intake(topic, subject))

  describe('a quotation in a response pack', () => {
    it('goes out inside the pack PDF with its lines and total, and a foreign quotation is refused', async () => {
      const e = await enquiryInHand('quantities', 'Price for the north block wall system')
      const saved = await call(`/api/enquiries/${e.ref}/quotations`, { cookie: officer, body: quotation })
      expect(saved.status, JSON.stringify(saved.body)).toBe(201)
      const q = saved.body.quotation as { id: number, revision: string, totalCents: number, lines: Array<{ code: string, description: string, amount: number }> }

      const other = await enquiryInHand('quantities', 'Price for the south block')
      const foreign = await call(`/api/enquiries/${other.ref}/quotations`, { cookie: officer, body: quotation })
      const before = await rows<{ n: number }>('SELECT COUNT(*) AS n FROM response_packs WHERE enquiry_id = ?', [e.id])
      const refused = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'Our price follows.', quotationIds: [foreign.body.quotation.id] } })
      expect(refused.status).toBe(400)
      expect(refused.body.message).toBe(`quotationIds.0: Quotation ${foreign.body.quotation.id} is not saved to ${e.ref}.`)
      expect((await rows<{ n: number }>('SELECT COUNT(*) AS n FROM response_packs WHERE enquiry_id = ?', [e.id]))[0]!.n).toBe(before[0]!.n)

      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'Our price for the full system follows, with the window details.', items: ['D-WIN-03'], quotationIds: [q.id] } })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.pack).toMatchObject({ revision: 'A', status: 'issued', quotationIds: [q.id] })

      const mail = await catcher.waitFor(m => m.subject.startsWith(`Re: ${e.ref}`) && m.attachments.some(a => a.filename === `${e.ref}-response-rev-A.pdf`))
      const { text } = await pdfText(mail.attachments.find(a => a.contentType === 'application/pdf')!.content)
      expect(text).toContain(`Quotation ${e.ref}-${q.revision}: Full system: masonry and ETICS installed, total € ${formatCents(q.totalCents)} including VAT`)
      expect(text).toContain(`Total € ${formatCents(q.totalCents)} including VAT at 23 %`)
      const blocks = q.lines.find(l => l.code === 'blocks')!
      expect(text).toContain(blocks.description)
      expect(text).toContain(formatCents(blocks.amount))
      expect(text).toContain('Demo prices — invented')
      expect(text).toContain('Window jamb, frame at block face')
    })
  })

  describe('the waiting-on-you reminder', () => {
    it('is mailed once per wait, threaded, and recorded on the enquiry', async () => {
      const e = await enquiryInHand('thermal', 'U-value of the gable wall')
      const reply = await call(`/api/enquiries/${e.ref}/messages`, { cookie: officer, body: { kind: 'reply', body: 'Which insulation thickness does the energy assessment assume for the gable?' } })
      expect(reply.status, JSON.stringify(reply.body)).toBe(201)
      expect((await call(`/api/enquiries/${e.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'waiting_on_requester' } })).status).toBe(200)
      const before = await rows<{ message_id: string }>('SELECT message_id FROM outbox_messages WHERE enquiry_id = ? ORDER BY id', [e.id])

      // The wait began long enough ago (a tenth of a working day is 51 minutes; a week has several).
      await testDb().query('UPDATE enquiries SET waiting_since = ? WHERE id = ?', { replacements: [new Date(Date.now() - 7 * 86_400_000), e.id], type: QueryTypes.UPDATE })
      const mail = await catcher.waitFor(m => m.subject === `${e.ref} is waiting for you: U-value of the gable wall`)
      expect(mail.envelopeTo).toEqual(['architect@hallorans.example'])
      expect(mail.text).toContain('Which insulation thickness does the energy assessment assume for the gable?')
      expect(mail.text).toContain(`/my-enquiries/${e.ref}`)
      expect(mail.headers['in-reply-to']).toBe(before.at(-1)!.message_id)
      expect(mail.headers['reply-to']).toMatch(/\+[0-9a-f]{32}@/)
      expect(mail.html).toContain('is waiting for your answer')

      const [event] = await rows<{ kind: string, actor_user_id: number | null }>('SELECT kind, actor_user_id FROM enquiry_events WHERE enquiry_id = ? AND kind = \'reminder\'', [e.id])
      expect(event).toEqual({ kind: 'reminder', actor_user_id: null })
      const file = await call(`/api/enquiries/${e.ref}`, { cookie: officer })
      expect(file.body.events.filter((ev: { kind: string }) => ev.kind === 'reminder')).toHaveLength(1)

      // Several more sweeps run; the same wait is not reminded again.
      await new Promise(resolve => setTimeout(resolve, 2000))
      const reminders = await rows<{ n: number }>('SELECT COUNT(*) AS n FROM outbox_messages WHERE enquiry_id = ? AND kind = \'reminder\'', [e.id])
      expect(Number(reminders[0]!.n)).toBe(1)
    })

    it('waits for a wait that is not yet due', async () => {
      const e = await enquiryInHand('thermal', 'Condensation risk at the parapet')
      expect((await call(`/api/enquiries/${e.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'waiting_on_requester' } })).status).toBe(200)
      await new Promise(resolve => setTimeout(resolve, 2000))
      const reminders = await rows<{ n: number }>('SELECT COUNT(*) AS n FROM outbox_messages WHERE enquiry_id = ? AND kind = \'reminder\'', [e.id])
      expect(Number(reminders[0]!.n)).toBe(0)
    })
  })

  describe('closing an enquiry', () => {
    it('tells the requester, threaded onto the earlier mail', async () => {
      const e = await enquiryInHand('site_practice', 'Cold-weather laying of the thin-joint mortar')
      const before = await rows<{ message_id: string }>('SELECT message_id FROM outbox_messages WHERE enquiry_id = ? ORDER BY id', [e.id])
      expect((await call(`/api/enquiries/${e.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'answered' } })).status).toBe(200)
      expect((await call(`/api/enquiries/${e.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'closed' } })).status).toBe(200)
      const mail = await catcher.waitFor(m => m.subject === `${e.ref} closed: Cold-weather laying of the thin-joint mortar`)
      expect(mail.text).toContain('reply to this e-mail')
      const [closer] = await rows<{ name: string }>('SELECT name FROM users WHERE email = ?', [demo.officer])
      expect(mail.text).toContain(closer!.name)
      expect(mail.headers.references).toContain(before[0]!.message_id)
    })
  })

  describe('sent items the library has moved on from', () => {
    it('are flagged on the open enquiry and on the desk once a manager supersedes one, and not before', async () => {
      const e = await enquiryInHand('junctions', 'Jamb detail for the stair core')
      const issued = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'The jamb detail is attached.', items: ['D-WIN-03'] } })
      expect(issued.status, JSON.stringify(issued.body)).toBe(201)
      expect((await call(`/api/enquiries/${e.ref}`, { cookie: officer })).body.staleItems).toEqual([])

      const marked = await call('/api/library/items/D-WIN-03/supersede', { cookie: manager, body: { successor: 'D-WIN-04' } })
      expect(marked.status, JSON.stringify(marked.body)).toBe(200)
      const file = await call(`/api/enquiries/${e.ref}`, { cookie: officer })
      expect(file.body.staleItems).toEqual([{
        enquiryRef: e.ref, packRevision: 'A', code: 'D-WIN-03', title: 'Window jamb, frame at block face', sentRevision: 'B',
        change: 'superseded', currentRevision: 'B', supersededBy: 'D-WIN-04',
      }])
      const desk = await call('/api/desk/stale-items', { cookie: officer })
      expect(desk.status).toBe(200)
      expect(desk.body.items.filter((i: { enquiryRef: string }) => i.enquiryRef === e.ref)).toHaveLength(1)
      // The requester's side is not told about the desk's flags.
      expect((await call(`/api/enquiries/${e.ref}`, { cookie: specA })).body.staleItems).toEqual([])
      expect((await call('/api/desk/stale-items', { cookie: specA })).status).toBe(403)

      // A closed enquiry drops off the desk's list.
      expect((await call(`/api/enquiries/${e.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'closed' } })).status).toBe(200)
      const after = await call('/api/desk/stale-items', { cookie: officer })
      expect(after.body.items.filter((i: { enquiryRef: string }) => i.enquiryRef === e.ref)).toHaveLength(0)
    })
  })
})
