import { z } from 'zod'

/** The life of an enquiry, in Perpend's own words. */
export const enquiryStatuses = ['received', 'triaged', 'in_hand', 'waiting_on_requester', 'answered', 'closed', 'reopened'] as const
export const enquiryStatusSchema = z.enum(enquiryStatuses)
export type EnquiryStatus = z.infer<typeof enquiryStatusSchema>

export const enquiryStatusLabels: Record<EnquiryStatus, string> = {
  received: 'Received',
  triaged: 'Triaged',
  in_hand: 'In hand',
  waiting_on_requester: 'Waiting on requester',
  answered: 'Answered',
  closed: 'Closed',
  reopened: 'Reopened',
}

export const enquiryTopics = ['thermal', 'moisture', 'junctions', 'structure', 'wind', 'fire', 'air_tightness', 'quantities', 'site_practice', 'other'] as const
export const enquiryTopicSchema = z.enum(enquiryTopics)
export type EnquiryTopic = z.infer<typeof enquiryTopicSchema>

export const enquiryTopicLabels: Record<EnquiryTopic, string> = {
  thermal: 'Thermal',
  moisture: 'Moisture',
  junctions: 'Junction detailing',
  structure: 'Structure',
  wind: 'Wind and fixings',
  fire: 'Fire',
  air_tightness: 'Air tightness',
  quantities: 'Quantities and price',
  site_practice: 'Site practice',
  other: 'Other',
}

export const enquiryRefSchema = z.object({
  ref: z.string().regex(/^TQ-\d{4}-\d{4,}$/, 'Not a valid enquiry reference'),
})
