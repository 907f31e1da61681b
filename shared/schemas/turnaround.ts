import { z } from 'zod'
import { enquiryTopicSchema, prioritySchema } from './enquiry'

/** The periods a manager can choose; `custom` takes local dates `from` and `to` (both days included). */
export const turnaroundPeriods = ['week', '4-weeks', 'quarter', 'custom'] as const
export type TurnaroundPeriod = typeof turnaroundPeriods[number]

export const turnaroundPeriodLabels: Record<TurnaroundPeriod, string> = {
  'week': 'This week',
  '4-weeks': 'Last 4 weeks',
  'quarter': 'Last 13 weeks',
  'custom': 'Chosen dates',
}

const localDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD')
  .refine(v => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v), 'Not a calendar date')

const id = z.coerce.number().int().positive()

/** Query of the manager's turnaround figures, their CSV export and an officer's own figures. */
export const turnaroundQuerySchema = z.object({
  period: z.enum(turnaroundPeriods).default('4-weeks'),
  from: localDate.optional(),
  to: localDate.optional(),
  topic: enquiryTopicSchema.optional(),
  officer: id.optional(),
  organisation: id.optional(),
  priority: prioritySchema.optional(),
}).superRefine((q, ctx) => {
  if (q.period !== 'custom') return
  if (!q.from) ctx.addIssue({ code: 'custom', path: ['from'], message: 'Choose the first day of the period' })
  if (!q.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'Choose the last day of the period' })
  if (q.from && q.to) {
    if (q.to < q.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last day is before the first day' })
    else if ((Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 > 366) ctx.addIssue({ code: 'custom', path: ['to'], message: 'Choose a period of a year or less' })
  }
})
export type TurnaroundQuery = z.infer<typeof turnaroundQuerySchema>
