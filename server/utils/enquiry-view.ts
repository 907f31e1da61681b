import type { Enquiry, Organisation, Project, User } from '../models'

type Loaded = Enquiry & { assignee?: User | null, organisation?: Organisation | null, project?: Project | null }

/** One row of the officers' queue. */
export function queueRow(e: Loaded, now = new Date()) {
  return {
    ref: e.ref,
    subject: e.subject,
    topic: e.topic,
    status: String(e.status),
    priority: String(e.priority),
    requesterName: e.requesterName,
    organisation: e.organisation?.name ?? e.requesterOrganisation ?? null,
    project: e.project?.name ?? null,
    assignee: e.assignee ? { id: Number(e.assignee.id), name: e.assignee.name } : null,
    receivedAt: e.receivedAt,
    lastActivityAt: e.lastActivityAt,
    clock: clockState(e, now),
  }
}
