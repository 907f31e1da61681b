import { DataTypes } from 'sequelize'
import type { Migration } from './types'

const timestamps = {
  created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
  updated_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
}

/** Organisations, people, projects and enquiries: the records every later table hangs from. */
export const foundation: Migration = {
  name: '0001-foundation',
  async up(qi) {
    await qi.createTable('organisations', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      kind: { type: DataTypes.STRING(40), allowNull: false, defaultValue: 'other' },
      merged_into_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'organisations', key: 'id' } },
      ...timestamps,
    })
    await qi.addIndex('organisations', ['name'], { name: 'organisations_name' })

    await qi.createTable('users', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      name: { type: DataTypes.STRING(200), allowNull: false },
      password_hash: { type: DataTypes.STRING(255), allowNull: true },
      role: { type: DataTypes.ENUM('specifier', 'officer', 'manager', 'admin'), allowNull: false, defaultValue: 'specifier' },
      organisation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'organisations', key: 'id' } },
      phone: { type: DataTypes.STRING(40), allowNull: true },
      email_verified_at: { type: DataTypes.DATE(3), allowNull: true },
      deactivated_at: { type: DataTypes.DATE(3), allowNull: true },
      last_sign_in_at: { type: DataTypes.DATE(3), allowNull: true },
      ...timestamps,
    })
    await qi.addIndex('users', ['email'], { unique: true, name: 'users_email' })
    await qi.addIndex('users', ['organisation_id'], { name: 'users_organisation' })

    await qi.createTable('projects', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'organisations', key: 'id' } },
      name: { type: DataTypes.STRING(200), allowNull: false },
      site_address: { type: DataTypes.STRING(400), allowNull: true },
      region: { type: DataTypes.STRING(80), allowNull: true },
      stage: { type: DataTypes.STRING(20), allowNull: false },
      building_type: { type: DataTypes.STRING(80), allowNull: true },
      storeys: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
      wall_area_m2: { type: DataTypes.DECIMAL(10, 1), allowNull: true },
      ...timestamps,
    })
    await qi.addIndex('projects', ['organisation_id'], { name: 'projects_organisation' })

    await qi.createTable('enquiries', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      ref: { type: DataTypes.STRING(20), allowNull: false },
      ref_year: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      ref_seq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'received' },
      topic: { type: DataTypes.STRING(30), allowNull: false },
      priority: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'normal' },
      subject: { type: DataTypes.STRING(200), allowNull: false },
      question: { type: DataTypes.TEXT, allowNull: false },
      requester_user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      requester_name: { type: DataTypes.STRING(200), allowNull: false },
      requester_email: { type: DataTypes.STRING(254), allowNull: false },
      requester_phone: { type: DataTypes.STRING(40), allowNull: true },
      requester_organisation: { type: DataTypes.STRING(200), allowNull: true },
      organisation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'organisations', key: 'id' } },
      project_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'projects', key: 'id' } },
      assignee_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      received_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      first_response_at: { type: DataTypes.DATE(3), allowNull: true },
      answered_at: { type: DataTypes.DATE(3), allowNull: true },
      closed_at: { type: DataTypes.DATE(3), allowNull: true },
      ...timestamps,
    })
    await qi.addIndex('enquiries', ['ref'], { unique: true, name: 'enquiries_ref' })
    await qi.addIndex('enquiries', ['ref_year', 'ref_seq'], { unique: true, name: 'enquiries_ref_seq' })
    await qi.addIndex('enquiries', ['status', 'received_at'], { name: 'enquiries_status_received' })
    await qi.addIndex('enquiries', ['organisation_id', 'received_at'], { name: 'enquiries_organisation_received' })
    await qi.addIndex('enquiries', ['assignee_id', 'status'], { name: 'enquiries_assignee_status' })
  },
  async down(qi) {
    await qi.dropTable('enquiries')
    await qi.dropTable('projects')
    await qi.dropTable('users')
    await qi.dropTable('organisations')
  },
}
