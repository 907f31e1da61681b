import { z } from 'zod'
import { OutboxMessage } from '../../../../models'

const paramsSchema = z.object({ id: z.coerce.number().int().positive() })

/**
 * Gives a message the worker gave up on a fresh set of attempts (after the address or the mail server was
 * fixed). Only failed messages: a pending one is already on its way, a sent one would go twice.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireAdmin(event)
  const { id } = await getValidatedRouterParams(event, parseWith(paramsSchema))
  useDb()
  const message = await OutboxMessage.findByPk(id)
  if (!message) notFound('message')
  const [changed] = await OutboxMessage.update(
    { status: 'pending', attempts: 0, nextAttemptAt: new Date() },
    { where: { id, status: 'failed' } },
  )
  if (!changed) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `This message is ${message.status}; only a failed message can be retried.` })
  await recordAudit(event, { actorUserId: caller.id, action: 'outbox.retry', subjectType: 'outbox_message', subjectId: id, detail: { lastError: message.lastError } })
  void deliverDueMail().catch(() => {})
  return { id, status: 'pending' }
})
