import type { Transaction } from 'sequelize'
import { EnquiryEvent } from '../models'
import type { Enquiry } from '../models'

/**
 * What a message from the requester's side does to the enquiry's life, however it arrives (the web form or
 * an e-mailed answer): a waiting enquiry goes back to "in hand", an answered or closed one is reopened, with
 * the change in the event log. The caller holds the enquiry locked and saves it afterwards.
 */
export async function resumeOnRequesterMessage(enquiry: Enquiry, actorUserId: number | null, now: Date, transaction: Transaction): Promise<void> {
  const next = enquiry.status === 'waiting_on_requester' ? 'in_hand' : ['answered', 'closed'].includes(enquiry.status) ? 'reopened' : null
  if (!next) return
  await EnquiryEvent.create({ enquiryId: enquiry.id, actorUserId, kind: 'status', fromValue: enquiry.status, toValue: next, createdAt: now }, { transaction })
  enquiry.status = next
  if (next === 'reopened') {
    enquiry.answeredAt = null
    enquiry.closedAt = null
  }
}
