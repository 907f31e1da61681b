import { libraryCodeParamsSchema, librarySupersedeBodySchema } from '../../../../../shared/library/inputs'

/**
 * Marks an item superseded by a successor of the same kind, over the content's own status (managers).
 * `successor: null` takes the mark away again, so the content's own status shows.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireManager(event)
  const { code } = await getValidatedRouterParams(event, parseWith(libraryCodeParamsSchema))
  const { successor } = await readValidatedBody(event, parseWith(librarySupersedeBodySchema))

  const item = await getLibraryItem(event, code)
  if (!item) notFound('library item')
  if (successor !== null) {
    if (successor === code) throw createError({ statusCode: 422, statusMessage: 'Invalid successor', message: 'An item cannot supersede itself.' })
    const next = await getLibraryItem(event, successor)
    if (!next) throw createError({ statusCode: 422, statusMessage: 'Invalid successor', message: `There is no library item ${successor}.` })
    if (next.collection !== item.collection) {
      throw createError({ statusCode: 422, statusMessage: 'Invalid successor', message: `${successor} is not of the same kind as ${code}; choose a successor from the same collection.` })
    }
    // A superseded successor would send readers down a chain (or round a loop) instead of to the sheet to use.
    if (next.status === 'superseded') {
      throw createError({ statusCode: 409, statusMessage: 'Successor superseded', message: `${successor} is itself superseded; choose the item that replaces it.` })
    }
  }

  await setLibraryOverride(code, successor, caller.id)
  await recordAudit(event, {
    actorUserId: caller.id,
    action: successor === null ? 'library.supersede-cleared' : 'library.superseded',
    subjectType: 'library-item',
    subjectId: code,
    detail: { successor, previousStatus: item.status, previousSuccessor: item.supersededBy },
  })
  return getLibraryItem(event, code)
})
