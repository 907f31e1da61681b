import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * Mail that came in but could not be threaded onto an enquiry on its own (no matching token or thread, a
 * sender the enquiry does not know, an automatic reply). It waits here for an officer's decision; the raw
 * message is kept in the upload store under raw_key so that an "attach" brings its drawings along.
 */
export const inboundMail: Migration = {
  name: '0006-inbound-mail',
  async up(qi) {
    await qi.createTable('inbound_quarantine', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      received_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      from_address: { type: DataTypes.STRING(254), allowNull: false },
      to_addresses: { type: DataTypes.STRING(1000), allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      reason: { type: DataTypes.STRING(20), allowNull: false }, // no-match | unknown-sender | auto-reply
      raw_size: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      raw_key: { type: DataTypes.STRING(80), allowNull: true },
      message_id: { type: DataTypes.STRING(250), allowNull: true },
      text_body: { type: DataTypes.TEXT('medium'), allowNull: false },
      // JSON list of the attachments' names, types and sizes, so the officer sees what would come along.
      attachment_list: { type: DataTypes.TEXT, allowNull: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'enquiries', key: 'id' } },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'held' }, // held | released | discarded
      decided_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      decided_at: { type: DataTypes.DATE(3), allowNull: true },
    })
    await qi.addIndex('inbound_quarantine', ['status', 'received_at'], { name: 'inbound_quarantine_status' })
    // Inbound answers are matched on In-Reply-To/References against the Message-IDs the outbox sent.
    await qi.addIndex('outbox_messages', ['message_id'], { name: 'outbox_message_id' })
  },
  async down(qi) {
    await qi.removeIndex('outbox_messages', 'outbox_message_id')
    await qi.dropTable('inbound_quarantine')
  },
}
