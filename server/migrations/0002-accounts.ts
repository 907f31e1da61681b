import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/** Single-use e-mail tokens, sign-in attempts for the lock-out, the audit trail and the mail outbox. */
export const accounts: Migration = {
  name: '0002-accounts',
  async up(qi) {
    await qi.createTable('user_tokens', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      purpose: { type: DataTypes.STRING(20), allowNull: false },
      // Only a SHA-256 of the token is stored: a leaked table opens no account.
      token_hash: { type: DataTypes.CHAR(64), allowNull: false },
      expires_at: { type: DataTypes.DATE(3), allowNull: false },
      used_at: { type: DataTypes.DATE(3), allowNull: true },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('user_tokens', ['token_hash'], { unique: true, name: 'user_tokens_hash' })
    await qi.addIndex('user_tokens', ['user_id', 'purpose'], { name: 'user_tokens_user' })

    await qi.createTable('sign_in_attempts', {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      ip: { type: DataTypes.STRING(45), allowNull: false },
      succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('sign_in_attempts', ['email', 'created_at'], { name: 'sign_in_attempts_email' })
    await qi.addIndex('sign_in_attempts', ['ip', 'created_at'], { name: 'sign_in_attempts_ip' })

    await qi.createTable('audit_events', {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      actor_user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      action: { type: DataTypes.STRING(40), allowNull: false },
      subject_type: { type: DataTypes.STRING(30), allowNull: true },
      subject_id: { type: DataTypes.STRING(40), allowNull: true },
      detail: { type: DataTypes.TEXT, allowNull: true },
      ip: { type: DataTypes.STRING(45), allowNull: true },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('audit_events', ['created_at'], { name: 'audit_events_created' })
    await qi.addIndex('audit_events', ['action', 'created_at'], { name: 'audit_events_action' })

    await qi.createTable('outbox_messages', {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      kind: { type: DataTypes.STRING(30), allowNull: false },
      to_address: { type: DataTypes.STRING(254), allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      text_body: { type: DataTypes.TEXT('medium'), allowNull: false },
      html_body: { type: DataTypes.TEXT('medium'), allowNull: true },
      headers: { type: DataTypes.TEXT, allowNull: true },
      message_id: { type: DataTypes.STRING(250), allowNull: false },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'enquiries', key: 'id' } },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' },
      attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
      next_attempt_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      last_error: { type: DataTypes.STRING(500), allowNull: true },
      sent_at: { type: DataTypes.DATE(3), allowNull: true },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('outbox_messages', ['status', 'next_attempt_at'], { name: 'outbox_due' })
    await qi.addIndex('outbox_messages', ['enquiry_id'], { name: 'outbox_enquiry' })
  },
  async down(qi) {
    await qi.dropTable('outbox_messages')
    await qi.dropTable('audit_events')
    await qi.dropTable('sign_in_attempts')
    await qi.dropTable('user_tokens')
  },
}
