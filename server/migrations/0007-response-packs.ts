import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * Response packs: each issue of a reply with its library items, calculations and cautions, rendered to a PDF
 * that is stored as an attachment. A re-issue is a new row with the next revision letter; issued rows are
 * never changed. Outgoing mail gains a list of stored attachments to send with it.
 */
export const responsePacks: Migration = {
  name: '0007-response-packs',
  async up(qi) {
    await qi.createTable('response_packs', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'enquiries', key: 'id' } },
      revision: { type: DataTypes.CHAR(1), allowNull: false },
      message_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'enquiry_messages', key: 'id' } },
      attachment_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'attachments', key: 'id' } },
      officer_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' } },
      checker_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'draft' }, // draft | awaiting-check | issued
      reply_body: { type: DataTypes.TEXT('medium'), allowNull: false },
      // JSON as text, pinned at composing time: the pack shows the items and calculations as they were then.
      items: { type: DataTypes.TEXT, allowNull: false },
      calculation_ids: { type: DataTypes.TEXT, allowNull: false },
      cautions: { type: DataTypes.TEXT, allowNull: false },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      issued_at: { type: DataTypes.DATE(3), allowNull: true },
    })
    await qi.addIndex('response_packs', ['enquiry_id', 'revision'], { name: 'response_packs_revision', unique: true })
    await qi.addColumn('outbox_messages', 'attachment_ids', { type: DataTypes.TEXT, allowNull: true })
  },
  async down(qi) {
    await qi.removeColumn('outbox_messages', 'attachment_ids')
    await qi.dropTable('response_packs')
  },
}
