import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>
  declare actorUserId: ForeignKey<number> | null
  declare action: string
  declare subjectType: string | null
  declare subjectId: string | null
  declare detail: string | null
  declare ip: string | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    AuditEvent.init({
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      actorUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      action: { type: DataTypes.STRING(40), allowNull: false },
      subjectType: { type: DataTypes.STRING(30), allowNull: true },
      subjectId: { type: DataTypes.STRING(40), allowNull: true },
      detail: { type: DataTypes.TEXT, allowNull: true },
      ip: { type: DataTypes.STRING(45), allowNull: true },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'audit_events', underscored: true, updatedAt: false })
  }
}
