import type { z } from 'zod'

/**
 * A zod parser for h3's readValidatedBody / getValidatedQuery / getValidatedRouterParams that answers bad
 * input with a 400 whose message names the field in words a person understands (not a stack of issues).
 */
export function parseWith<T extends z.ZodType>(schema: T) {
  return (data: unknown): z.infer<T> => {
    const result = schema.safeParse(data)
    if (result.success) return result.data
    const issue = result.error.issues[0]!
    const field = issue.path.length ? `${issue.path.join('.')}: ` : ''
    const message = `${field}${issue.message}`
    throw createError({
      statusCode: 400,
      statusMessage: 'Invalid input',
      message,
      data: { issues: result.error.issues.map(i => ({ path: i.path.join('.'), message: i.message })) },
    })
  }
}
