import { z } from 'zod'
import { emailSchema } from './auth'
import { enquiryRefPattern, enquiryStatuses, enquiryTopics, priorities, projectStages, queueSorts } from '../types/enquiry'

export const enquiryStatusSchema = z.enum(enquiryStatuses)
export const enquiryTopicSchema = z.enum(enquiryTopics)
export const enquiryRefSchema = z.object({
  ref: z.string().regex(enquiryRefPattern, 'Not a valid enquiry reference'),
})

export const prioritySchema = z.enum(priorities)

const optionalText = (max: number) => z.string().trim().max(max).optional().transform(v => (v ? v : undefined))

export const requesterSchema = z.object({
  name: z.string().trim().min(2, 'Enter your name').max(200),
  organisation: z.string().trim().min(2, 'Enter your organisation').max(200),
  email: emailSchema,
  phone: z.string().trim().min(6, 'Enter a phone number we can call about the query').max(40),
})

export const projectInputSchema = z.object({
  name: z.string().trim().min(2, 'Enter the project name').max(200),
  siteAddress: optionalText(400),
  region: z.string().trim().min(2, 'Enter the county or region').max(80),
  stage: z.enum(projectStages, 'Choose the project stage'),
  buildingType: optionalText(80),
  storeys: z.coerce.number().int('Storeys is a whole number').min(1, 'At least one storey').max(60, 'At most 60 storeys').optional(),
  wallAreaM2: z.coerce.number().positive('Wall area must be more than zero').max(1_000_000).optional(),
})

export const questionSchema = z.object({
  topic: enquiryTopicSchema,
  subject: z.string().trim().min(5, 'Give the query a short subject (5 characters or more)').max(200),
  question: z.string().trim().min(20, 'Describe the question in at least 20 characters').max(20_000, 'The question is too long (20,000 characters at most)'),
  priority: prioritySchema.default('normal'),
})

/** The whole intake: anonymous requesters add their contact details; signed-in ones are known. */
export const enquiryIntakeSchema = z.object({
  requester: requesterSchema.optional(),
  project: projectInputSchema,
}).extend(questionSchema.shape)
export type EnquiryIntake = z.infer<typeof enquiryIntakeSchema>

const csv = <T extends z.ZodType>(item: T) => z.union([item, z.array(item)]).optional()
  .transform(v => (v === undefined ? undefined : Array.isArray(v) ? v : [v]))

export const queueQuerySchema = z.object({
  status: csv(enquiryStatusSchema),
  topic: csv(enquiryTopicSchema),
  priority: prioritySchema.optional(),
  assignee: z.union([z.literal('me'), z.literal('none'), z.coerce.number().int().positive()]).optional(),
  organisation: z.coerce.number().int().positive().optional(),
  overdue: z.enum(['1', 'true']).optional().transform(v => !!v),
  q: z.string().trim().max(200).optional(),
  sort: z.enum(queueSorts).default('received-desc'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(5).max(100).default(25),
})
export type QueueQuery = z.infer<typeof queueQuerySchema>

export const enquiryPatchSchema = z.object({
  status: enquiryStatusSchema.optional(),
  priority: prioritySchema.optional(),
  assigneeId: z.number().int().positive().nullable().optional(),
}).refine(v => v.status !== undefined || v.priority !== undefined || v.assigneeId !== undefined, 'Nothing to change')

export const messageInputSchema = z.object({
  kind: z.enum(['reply', 'note', 'requester']).optional(),
  body: z.string().trim().min(1, 'Write a message').max(20_000, 'The message is too long (20,000 characters at most)'),
})

export const mergeInputSchema = z.object({
  intoRef: z.string().regex(/^TQ-\d{4}-\d{4,}$/, 'intoRef: Not a valid enquiry reference'),
})

export const serviceTargetsSchema = z.object({
  targets: z.array(z.object({
    priority: prioritySchema,
    firstResponseMinutes: z.number().int().min(15, 'A target is at least 15 working minutes').max(60 * 510),
    answerMinutes: z.number().int().min(15, 'A target is at least 15 working minutes').max(60 * 510),
  })).min(1).max(2),
})

export const allStatuses = enquiryStatuses
