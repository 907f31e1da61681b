import type { z } from 'zod'

/**
 * A zod parser for h3's readValidatedBody / getValidatedQuery / getValidatedRouterParams that answers bad
 * input with a 400 whose message names the field in words a person understands (not a stack of issues).
 */
export function parseWith<T extends z.ZodType>(schema: T) {
  return (data: unknown): z.infer<T> => {
    const result = schema.safeParse(data, { reportInput: true })
    if (result.success) return result.data
    const issue = result.error.issues[0]!
    const field = issue.path.length ? `${issue.path.join('.')}: ` : ''
    const message = `${field}${plainMessage(issue)}`
    throw createError({
      statusCode: 400,
      statusMessage: 'Invalid input',
      message,
      data: { issues: result.error.issues.map(i => ({ path: i.path.join('.'), message: i.message })) },
    })
  }
}

const typeWords: Record<string, string> = {
  string: 'text', number: 'a number', int: 'a whole number', boolean: 'yes or no (true or false)', array: 'a list',
  object: 'a group of fields', date: 'a date', bigint: 'a whole number',
}

function received(value: unknown): string {
  if (value === null) return 'nothing (null)'
  if (Array.isArray(value)) return 'a list'
  if (typeof value === 'string') return 'text'
  if (typeof value === 'number') return 'a number'
  if (typeof value === 'boolean') return 'true or false'
  if (typeof value === 'object') return 'a group of fields'
  return typeof value
}

/**
 * Our schemas word their own messages; zod's built-in ones for a missing or wrongly typed field
 * ("Invalid input: expected string, received undefined") are put in plain words here.
 */
function plainMessage(issue: z.core.$ZodIssue): string {
  if (issue.code !== 'invalid_type' || !issue.message.startsWith('Invalid input')) return issue.message
  if (issue.input === undefined) return 'This is required but was not given.'
  return `This should be ${typeWords[issue.expected] ?? issue.expected}, not ${received(issue.input)}.`
}
