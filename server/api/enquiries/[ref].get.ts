import { Op } from 'sequelize'
import { Attachment, Enquiry, EnquiryEvent, EnquiryMessage, Project, User } from '../../models'

/**
 * The enquiry file. Staff see everything (internal notes, events, internal files); the requester's side
 * sees the public thread only. "Not yours" and "no such enquiry" answer alike (404).
 */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const enquiry = await findEnquiryFor(event, caller)
  const staff = isStaff(caller)
  const [project, assignee, messages, attachments, events, mergedInto] = await Promise.all([
    enquiry.projectId ? Project.findByPk(enquiry.projectId) : null,
    enquiry.assigneeId ? User.findByPk(enquiry.assigneeId, { attributes: ['id', 'name'] }) : null,
    EnquiryMessage.findAll({
      where: { enquiryId: enquiry.id, ...(staff ? {} : { kind: { [Op.ne]: 'note' } }) },
      order: [['createdAt', 'ASC'], ['id', 'ASC']],
    }),
    Attachment.findAll({ where: { enquiryId: enquiry.id, ...(staff ? {} : { internal: false }) }, order: [['id', 'ASC']] }),
    staff ? EnquiryEvent.findAll({ where: { enquiryId: enquiry.id }, order: [['createdAt', 'ASC'], ['id', 'ASC']] }) : [],
    enquiry.mergedIntoId ? Enquiry.findByPk(enquiry.mergedIntoId, { attributes: ['ref'] }) : null,
  ])
  const actorIds = [...new Set(events.map(e => e.actorUserId).filter((id): id is number => !!id))]
  const actors = actorIds.length ? await User.findAll({ where: { id: actorIds }, attributes: ['id', 'name'] }) : []
  const actorName = new Map(actors.map(a => [a.id, a.name]))
  const staleItems = staff ? await staleItemsOfEnquiry(event, enquiry.id, enquiry.ref) : []

  return {
    enquiry: {
      ref: enquiry.ref,
      subject: enquiry.subject,
      topic: enquiry.topic,
      // Plain values: Sequelize's branded attribute types would otherwise reach the client's route types.
      status: String(enquiry.status),
      priority: String(enquiry.priority),
      question: enquiry.question,
      questionHtml: renderMarkdown(enquiry.question),
      requester: {
        name: enquiry.requesterName,
        organisation: enquiry.requesterOrganisation,
        ...(staff ? { email: enquiry.requesterEmail, phone: enquiry.requesterPhone } : {}),
      },
      receivedAt: enquiry.receivedAt,
      firstResponseAt: enquiry.firstResponseAt,
      answeredAt: enquiry.answeredAt,
      closedAt: enquiry.closedAt,
      lastActivityAt: enquiry.lastActivityAt,
      mergedInto: mergedInto?.ref ?? null,
      assignee: assignee ? { id: Number(assignee.id), name: assignee.name } : null,
      clock: staff ? clockState(enquiry) : null,
      project: project
        ? { name: project.name, siteAddress: project.siteAddress, region: project.region, stage: project.stage, buildingType: project.buildingType, storeys: project.storeys, wallAreaM2: project.wallAreaM2 }
        : null,
    },
    messages: messages.map(m => ({
      id: Number(m.id),
      kind: m.kind,
      authorName: m.authorName,
      html: renderMarkdown(m.body),
      body: m.body,
      source: m.source,
      createdAt: m.createdAt,
    })),
    attachments: attachments.map(a => ({
      id: Number(a.id),
      messageId: a.messageId,
      fileName: a.fileName,
      fileType: a.fileType,
      contentType: a.contentType,
      sizeBytes: a.sizeBytes,
      sha256: a.sha256,
      internal: a.internal,
      createdAt: a.createdAt,
      url: `/api/enquiries/${enquiry.ref}/attachments/${a.id}`,
    })),
    events: events.map(e => ({ id: Number(e.id), kind: e.kind, from: e.fromValue, to: e.toValue, actor: e.actorUserId ? actorName.get(e.actorUserId) ?? null : null, createdAt: e.createdAt })),
    staleItems,
  }
})
