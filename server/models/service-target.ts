import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

/** The department's promise per priority, in working minutes. */
export class ServiceTarget extends Model<InferAttributes<ServiceTarget>, InferCreationAttributes<ServiceTarget>> {
  declare priority: string
  declare firstResponseMinutes: number
  declare answerMinutes: number
  declare updatedBy: ForeignKey<number> | null
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    ServiceTarget.init({
      priority: { type: DataTypes.STRING(10), primaryKey: true },
      firstResponseMinutes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      answerMinutes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'service_targets', underscored: true, createdAt: false })
  }
}
