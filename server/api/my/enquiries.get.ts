import { Enquiry, Project } from '../../models'

/** A specifier's own view: every enquiry of their organisation, newest activity first. */
export default defineEventHandler(async (event) => {
  const caller = await requireSpecifier(event)
  useDb()
  const rows = await Enquiry.findAll({
    where: { ...enquiryScope(caller), mergedIntoId: null },
    include: [{ model: Project, as: 'project', attributes: ['name'] }],
    order: [['lastActivityAt', 'DESC']],
    limit: 200,
  })
  return {
    enquiries: rows.map(e => ({
      ref: e.ref,
      subject: e.subject,
      topic: e.topic,
      status: e.status,
      project: (e as Enquiry & { project?: Project }).project?.name ?? null,
      receivedAt: e.receivedAt,
      lastActivityAt: e.lastActivityAt,
    })),
  }
})
