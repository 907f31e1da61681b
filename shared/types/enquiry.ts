/** The life of an enquiry, in Perpend's own words. */
export const enquiryStatuses = ['received', 'triaged', 'in_hand', 'waiting_on_requester', 'answered', 'closed', 'reopened'] as const
export type EnquiryStatus = typeof enquiryStatuses[number]

export const enquiryStatusLabels: Record<EnquiryStatus, string> = {
  received: 'Received',
  triaged: 'Triaged',
  in_hand: 'In hand',
  waiting_on_requester: 'Waiting on requester',
  answered: 'Answered',
  closed: 'Closed',
  reopened: 'Reopened',
}

export const enquiryTopics = ['thermal', 'moisture', 'junctions', 'structure', 'wind', 'fire', 'air_tightness', 'quantities', 'site_practice', 'other'] as const
export type EnquiryTopic = typeof enquiryTopics[number]

export const enquiryTopicLabels: Record<EnquiryTopic, string> = {
  thermal: 'Thermal',
  moisture: 'Moisture',
  junctions: 'Junction detailing',
  structure: 'Structure',
  wind: 'Wind and fixings',
  fire: 'Fire',
  air_tightness: 'Air tightness',
  quantities: 'Quantities and price',
  site_practice: 'Site practice',
  other: 'Other',
}

/** An enquiry's reference, as the desk gives it: TQ-2026-0042. */
export const enquiryRefPattern = /^TQ-\d{4}-\d{4,}$/

/** Limits shared by the intake form and the server. */
export const uploadLimits = {
  maxFiles: 20,
  maxFileBytes: 100 * 1024 * 1024,
  maxTotalBytes: 300 * 1024 * 1024,
  /** Kinds of drawing we accept, recognised from the file's bytes, never its name. */
  acceptedTypes: ['pdf', 'png', 'jpg', 'webp', 'dwg', 'dxf', 'ifc', 'zip'] as const,
  acceptAttribute: '.pdf,.png,.jpg,.jpeg,.webp,.dwg,.dxf,.ifc,.zip',
}
export type AcceptedFileType = typeof uploadLimits.acceptedTypes[number]

export const projectStages = ['feasibility', 'planning', 'tender', 'construction', 'completed'] as const
export const projectStageLabels: Record<typeof projectStages[number], string> = {
  feasibility: 'Feasibility',
  planning: 'Planning',
  tender: 'Tender',
  construction: 'Construction',
  completed: 'Completed',
}

export const priorities = ['normal', 'urgent'] as const
export type Priority = (typeof priorities)[number]
export const priorityLabels: Record<Priority, string> = { normal: 'Normal', urgent: 'Urgent — site stopped' }

/** Which status may follow which; the server refuses anything else. */
export const statusTransitions: Record<EnquiryStatus, EnquiryStatus[]> = {
  received: ['triaged', 'in_hand', 'closed'],
  triaged: ['in_hand', 'closed'],
  in_hand: ['waiting_on_requester', 'answered', 'closed'],
  waiting_on_requester: ['in_hand', 'answered', 'closed'],
  answered: ['closed', 'reopened'],
  closed: ['reopened'],
  reopened: ['in_hand', 'waiting_on_requester', 'answered', 'closed'],
}

export const queueSorts = ['received-desc', 'received-asc', 'due-asc', 'priority'] as const
