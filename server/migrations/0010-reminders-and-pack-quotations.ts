import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * When the requester was last reminded that an enquiry waits on them (cleared each time it starts to wait
 * again, so each wait gets one reminder), and the quotations a response pack carries.
 */
export const remindersAndPackQuotations: Migration = {
  name: '0010-reminders-and-pack-quotations',
  async up(qi) {
    await qi.addColumn('enquiries', 'reminded_at', { type: DataTypes.DATE(3), allowNull: true })
    await qi.addIndex('enquiries', ['status', 'reminded_at', 'waiting_since'], { name: 'enquiries_waiting_reminder' })
    await qi.addColumn('response_packs', 'quotation_ids', { type: DataTypes.TEXT, allowNull: true })
  },
  async down(qi) {
    await qi.removeColumn('response_packs', 'quotation_ids')
    await qi.removeIndex('enquiries', 'enquiries_waiting_reminder')
    await qi.removeColumn('enquiries', 'reminded_at')
  },
}
