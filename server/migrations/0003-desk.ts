import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * The desk: the thread, the event log, drawings, service targets and the per-year reference counter.
 * Due times are kept on the enquiry (recomputed on every change of state) so the queue can filter and
 * sort by them in SQL over 100,000 rows.
 */
export const desk: Migration = {
  name: '0003-desk',
  async up(qi) {
    await qi.addColumn('enquiries', 'merged_into_id', { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'enquiries', key: 'id' } })
    await qi.addColumn('enquiries', 'reply_token', { type: DataTypes.CHAR(32), allowNull: true })
    await qi.addColumn('enquiries', 'first_response_due_at', { type: DataTypes.DATE(3), allowNull: true })
    await qi.addColumn('enquiries', 'answer_due_at', { type: DataTypes.DATE(3), allowNull: true })
    // The due time of whichever clock is running (first response, else answer); null while paused or done.
    await qi.addColumn('enquiries', 'next_due_at', { type: DataTypes.DATE(3), allowNull: true })
    await qi.addColumn('enquiries', 'waiting_since', { type: DataTypes.DATE(3), allowNull: true })
    await qi.addColumn('enquiries', 'last_activity_at', { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW })
    await qi.addIndex('enquiries', ['reply_token'], { unique: true, name: 'enquiries_reply_token' })
    await qi.addIndex('enquiries', ['next_due_at'], { name: 'enquiries_next_due' })
    await qi.addIndex('enquiries', ['status', 'next_due_at'], { name: 'enquiries_status_due' })
    // Covers the queue's counts per status over live (not merged) enquiries without touching the rows.
    await qi.addIndex('enquiries', ['merged_into_id', 'status', 'next_due_at'], { name: 'enquiries_live_status' })
    await qi.addIndex('enquiries', ['topic', 'received_at'], { name: 'enquiries_topic_received' })
    await qi.addIndex('enquiries', ['priority', 'received_at'], { name: 'enquiries_priority_received' })
    await qi.addIndex('enquiries', ['received_at'], { name: 'enquiries_received' })
    await qi.sequelize.query('ALTER TABLE enquiries ADD FULLTEXT INDEX enquiries_text (subject, question, requester_name, requester_organisation)')

    await qi.createTable('reference_counters', {
      year: { type: DataTypes.SMALLINT.UNSIGNED, primaryKey: true },
      last_seq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    })

    await qi.createTable('enquiry_messages', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'enquiries', key: 'id' } },
      kind: { type: DataTypes.STRING(12), allowNull: false }, // question | requester | reply | note
      author_user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      author_name: { type: DataTypes.STRING(200), allowNull: false },
      body: { type: DataTypes.TEXT('medium'), allowNull: false },
      source: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'web' },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('enquiry_messages', ['enquiry_id', 'created_at'], { name: 'enquiry_messages_enquiry' })

    await qi.createTable('enquiry_events', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'enquiries', key: 'id' } },
      actor_user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      kind: { type: DataTypes.STRING(20), allowNull: false }, // status | assignee | priority | merged
      from_value: { type: DataTypes.STRING(100), allowNull: true },
      to_value: { type: DataTypes.STRING(100), allowNull: true },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('enquiry_events', ['enquiry_id', 'created_at'], { name: 'enquiry_events_enquiry' })
    await qi.addIndex('enquiry_events', ['kind', 'created_at'], { name: 'enquiry_events_kind' })

    await qi.createTable('attachments', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'enquiries', key: 'id' } },
      message_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'enquiry_messages', key: 'id' } },
      storage_key: { type: DataTypes.STRING(80), allowNull: false },
      file_name: { type: DataTypes.STRING(200), allowNull: false },
      file_type: { type: DataTypes.STRING(10), allowNull: false },
      content_type: { type: DataTypes.STRING(100), allowNull: false },
      size_bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      internal: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      uploaded_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('attachments', ['enquiry_id'], { name: 'attachments_enquiry' })
    await qi.addIndex('attachments', ['storage_key'], { unique: true, name: 'attachments_storage_key' })

    await qi.createTable('service_targets', {
      priority: { type: DataTypes.STRING(10), primaryKey: true },
      first_response_minutes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      answer_minutes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      updated_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      updated_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    // Working minutes: a working day is 09:00–17:30, 510 minutes.
    await qi.bulkInsert('service_targets', [
      { priority: 'normal', first_response_minutes: 2 * 510, answer_minutes: 5 * 510, updated_at: new Date() },
      { priority: 'urgent', first_response_minutes: 240, answer_minutes: 240, updated_at: new Date() },
    ])
  },
  async down(qi) {
    await qi.dropTable('service_targets')
    await qi.dropTable('attachments')
    await qi.dropTable('enquiry_events')
    await qi.dropTable('enquiry_messages')
    await qi.dropTable('reference_counters')
    await qi.removeIndex('enquiries', 'enquiries_text')
    for (const c of ['merged_into_id', 'reply_token', 'first_response_due_at', 'answer_due_at', 'next_due_at', 'waiting_since', 'last_activity_at']) await qi.removeColumn('enquiries', c)
  },
}
