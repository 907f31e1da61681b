import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export type EventKind = 'status' | 'assignee' | 'priority' | 'merged' | 'reminder'

export class EnquiryEvent extends Model<InferAttributes<EnquiryEvent>, InferCreationAttributes<EnquiryEvent>> {
  declare id: CreationOptional<number>
  declare enquiryId: ForeignKey<number>
  declare actorUserId: ForeignKey<number> | null
  declare kind: EventKind
  declare fromValue: string | null
  declare toValue: string | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    EnquiryEvent.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      actorUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      kind: { type: DataTypes.STRING(20), allowNull: false },
      fromValue: { type: DataTypes.STRING(100), allowNull: true },
      toValue: { type: DataTypes.STRING(100), allowNull: true },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'enquiry_events', underscored: true, updatedAt: false })
  }
}
