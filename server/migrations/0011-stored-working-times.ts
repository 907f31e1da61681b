import { DataTypes } from 'sequelize'
import { storeAllWorkingTimes } from '../database/working-times'
import type { Migration } from './types'

/**
 * The working time to the first reply and to the answer, stored on the enquiry when each clock stops, so the
 * manager's medians, P90s and target shares are worked out in SQL over index ranges instead of walking the
 * calendar for every row of a quarter. Filled in here for every enquiry already answered, with the desk's
 * own pause rule and calendar. The answered and first-reply indexes of 0009 are replaced by ones that also
 * carry the stored time, so a period's figures are read from the index alone.
 *
 * Also one index for the desk's queue: an officer's own work on one topic, the narrow set its free-text
 * search is applied to.
 */
const filters = ['merged_into_id', 'topic', 'priority', 'assignee_id', 'organisation_id']

export const storedWorkingTimes: Migration = {
  name: '0011-stored-working-times',
  async up(qi, sequelize) {
    await qi.addColumn('enquiries', 'first_response_working_ms', { type: DataTypes.BIGINT.UNSIGNED, allowNull: true })
    await qi.addColumn('enquiries', 'answer_working_ms', { type: DataTypes.BIGINT.UNSIGNED, allowNull: true })
    await storeAllWorkingTimes(sequelize)
    await qi.removeIndex('enquiries', 'enquiries_answered')
    await qi.removeIndex('enquiries', 'enquiries_first_response')
    await qi.addIndex('enquiries', ['answered_at', ...filters, 'answer_working_ms'], { name: 'enquiries_answered_time' })
    await qi.addIndex('enquiries', ['first_response_at', ...filters, 'first_response_working_ms'], { name: 'enquiries_first_response_time' })
    await qi.addIndex('enquiries', ['assignee_id', 'topic', 'received_at'], { name: 'enquiries_assignee_topic' })
  },
  async down(qi) {
    await qi.removeIndex('enquiries', 'enquiries_assignee_topic')
    await qi.removeIndex('enquiries', 'enquiries_first_response_time')
    await qi.removeIndex('enquiries', 'enquiries_answered_time')
    await qi.addIndex('enquiries', ['answered_at', ...filters, 'received_at', 'first_response_at'], { name: 'enquiries_answered' })
    await qi.addIndex('enquiries', ['first_response_at', ...filters, 'received_at', 'answered_at'], { name: 'enquiries_first_response' })
    await qi.removeColumn('enquiries', 'answer_working_ms')
    await qi.removeColumn('enquiries', 'first_response_working_ms')
  },
}
