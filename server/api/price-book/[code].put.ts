import { z } from 'zod'
import { updatePriceItemSchema } from '../../../shared/workbench/quotation'
import { PriceItem } from '../../models'

const paramsSchema = z.object({ code: z.string().trim().min(1).max(60, 'Not a valid price-book code') })

/** A manager changes one price; quotations already saved keep the prices they were made with. */
export default defineEventHandler(async (event) => {
  const caller = await requireManager(event)
  const { code } = await getValidatedRouterParams(event, parseWith(paramsSchema))
  const body = await readValidatedBody(event, parseWith(updatePriceItemSchema))
  const db = useDb()
  const updated = await db.transaction(async (transaction) => {
    const item = await PriceItem.findByPk(code, { transaction, lock: transaction.LOCK.UPDATE })
    if (!item) notFound('price-book item')
    const before = { unitPriceCents: item.unitPriceCents, packSize: item.packSize, description: item.description, active: item.active }
    item.unitPriceCents = body.unitPriceCents
    if (body.description !== undefined) item.description = body.description
    if (body.packSize !== undefined) item.packSize = body.packSize
    if (body.active !== undefined) item.active = body.active
    item.updatedBy = caller.id
    await item.save({ transaction })
    await recordAudit(event, {
      actorUserId: caller.id,
      action: 'price-book.updated',
      subjectType: 'price-item',
      subjectId: code,
      detail: { before, after: { unitPriceCents: item.unitPriceCents, packSize: item.packSize, description: item.description, active: item.active } },
    }, transaction)
    return item
  })
  return { item: priceBookRow(updated) }
})
