import { DataTypes, Model } from 'sequelize'
import type { ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import type { ItemStatus } from '../../shared/library/terms'

/** A manager's status mark over a library item's own status (one row per marked code). */
export class LibraryOverride extends Model<InferAttributes<LibraryOverride>, InferCreationAttributes<LibraryOverride>> {
  declare code: string
  declare status: ItemStatus
  declare supersededBy: string | null
  declare setBy: ForeignKey<number>
  declare setAt: Date

  static initModel(sequelize: Sequelize) {
    LibraryOverride.init({
      code: { type: DataTypes.STRING(16), allowNull: false, primaryKey: true },
      status: { type: DataTypes.STRING(12), allowNull: false },
      supersededBy: { type: DataTypes.STRING(16), allowNull: true },
      setBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      setAt: { type: DataTypes.DATE(3), allowNull: false },
    }, { sequelize, tableName: 'library_overrides', underscored: true, timestamps: false })
  }
}
