import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * Calculations saved to an enquiry. A row is a record of what was run, by whom and on which engine version:
 * it is never updated, only read and re-run, so it has no updated_at.
 */
export const calculations: Migration = {
  name: '0004-calculations',
  async up(qi) {
    await qi.createTable('calculations', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'enquiries', key: 'id' } },
      method: { type: DataTypes.STRING(30), allowNull: false },
      // JSON as text: read back exactly as written, whatever the server's JSON column type does to numbers.
      inputs: { type: DataTypes.TEXT('medium'), allowNull: false },
      outputs: { type: DataTypes.TEXT('medium'), allowNull: false },
      engine_version: { type: DataTypes.STRING(20), allowNull: false },
      created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' } },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.addIndex('calculations', ['enquiry_id', 'created_at'], { name: 'calculations_enquiry' })
  },
  async down(qi) {
    await qi.dropTable('calculations')
  },
}
