import { enquiryRefSchema } from '../../../shared/types/enquiry'
import { Enquiry, Project } from '../../models'

/** One enquiry, if the caller may see it; "not yours" and "no such enquiry" answer alike. */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const { ref } = await getValidatedRouterParams(event, parseWith(enquiryRefSchema))
  useDb()
  const enquiry = await Enquiry.findOne({
    where: { ref, ...enquiryScope(caller) },
    include: [{ model: Project, as: 'project' }],
  })
  if (!enquiry) notFound('enquiry')
  const project = (enquiry as Enquiry & { project?: Project }).project
  return {
    enquiry: {
      ref: enquiry.ref,
      subject: enquiry.subject,
      topic: enquiry.topic,
      status: enquiry.status,
      priority: enquiry.priority,
      question: enquiry.question,
      requesterName: enquiry.requesterName,
      receivedAt: enquiry.receivedAt,
      project: project ? { name: project.name, region: project.region, stage: project.stage, storeys: project.storeys } : null,
    },
  }
})
