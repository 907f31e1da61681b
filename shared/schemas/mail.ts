import { z } from 'zod'

/** Mail in and out, as the staff views filter and decide on it. */

export const outboxStatuses = ['pending', 'sent', 'failed'] as const
export const outboxStatusLabels: Record<typeof outboxStatuses[number], string> = {
  pending: 'Waiting to go',
  sent: 'Delivered to the mail server',
  failed: 'Gave up',
}

export const outboxQuerySchema = z.object({
  status: z.enum(outboxStatuses).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
})

export const quarantineStatuses = ['held', 'released', 'discarded'] as const
export const quarantineReasonLabels: Record<string, string> = {
  'no-match': 'Matches no enquiry',
  'unknown-sender': 'Sender not known on the enquiry',
  'auto-reply': 'Automatic reply',
}

export const quarantineQuerySchema = z.object({
  status: z.enum(quarantineStatuses).default('held'),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
})

/** An officer's decision on a held mail: thread it onto an enquiry as the requester's message, or throw it away. */
export const quarantineDecisionSchema = z.discriminatedUnion('action', [
  z.object({ action: z.literal('attach'), ref: z.string({ error: 'Enter the reference of the enquiry to attach it to' }).trim().toUpperCase().regex(/^TQ-\d{4}-\d{4,}$/, 'Enter an enquiry reference such as TQ-2026-0042') }),
  z.object({ action: z.literal('discard') }),
], { error: 'Choose "attach" or "discard"' })
export type QuarantineDecision = z.infer<typeof quarantineDecisionSchema>
