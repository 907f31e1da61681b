import type { Migration } from './types'

/**
 * Indexes for the manager's turnaround figures. Each period figure is a range on one instant (received,
 * first reply, answer, closure); each index leads with that instant and carries the filter columns
 * (and, for the reply and answer, the other instants the working time needs), so a quarter's rows are
 * read from the index alone. The event index covers every column the pause rule reads.
 */
const filters = ['merged_into_id', 'topic', 'priority', 'assignee_id', 'organisation_id']

export const turnaroundIndexes: Migration = {
  name: '0009-turnaround-indexes',
  async up(qi) {
    await qi.addIndex('enquiries', ['answered_at', ...filters, 'received_at', 'first_response_at'], { name: 'enquiries_answered' })
    await qi.addIndex('enquiries', ['first_response_at', ...filters, 'received_at', 'answered_at'], { name: 'enquiries_first_response' })
    await qi.addIndex('enquiries', ['closed_at', ...filters], { name: 'enquiries_closed' })
    await qi.addIndex('enquiries', ['received_at', ...filters], { name: 'enquiries_received_filters' })
    await qi.addIndex('enquiry_events', ['enquiry_id', 'kind', 'to_value', 'from_value', 'created_at'], { name: 'enquiry_events_enquiry_kind' })
  },
  async down(qi) {
    await qi.removeIndex('enquiry_events', 'enquiry_events_enquiry_kind')
    await qi.removeIndex('enquiries', 'enquiries_received_filters')
    await qi.removeIndex('enquiries', 'enquiries_closed')
    await qi.removeIndex('enquiries', 'enquiries_first_response')
    await qi.removeIndex('enquiries', 'enquiries_answered')
  },
}
