import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * A manager's status mark over a library item. The content files keep their own status; a row here is
 * shown over it, so the department can withdraw a sheet at once, before its content is revised.
 */
export const libraryStatus: Migration = {
  name: '0005-library-status',
  async up(qi) {
    await qi.createTable('library_overrides', {
      code: { type: DataTypes.STRING(16), allowNull: false, primaryKey: true },
      status: { type: DataTypes.STRING(12), allowNull: false },
      superseded_by: { type: DataTypes.STRING(16), allowNull: true },
      set_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' } },
      set_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
  },
  async down(qi) {
    await qi.dropTable('library_overrides')
  },
}
