import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

/** question: the enquiry's opening text; requester: their later messages; reply: to the requester; note: staff only. */
export type MessageKind = 'question' | 'requester' | 'reply' | 'note'

export class EnquiryMessage extends Model<InferAttributes<EnquiryMessage>, InferCreationAttributes<EnquiryMessage>> {
  declare id: CreationOptional<number>
  declare enquiryId: ForeignKey<number>
  declare kind: MessageKind
  declare authorUserId: ForeignKey<number> | null
  declare authorName: string
  declare body: string
  declare source: CreationOptional<'web' | 'email'>
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    EnquiryMessage.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: DataTypes.STRING(12), allowNull: false },
      authorUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      authorName: { type: DataTypes.STRING(200), allowNull: false },
      body: { type: DataTypes.TEXT('medium'), allowNull: false },
      source: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'web' },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'enquiry_messages', underscored: true, updatedAt: false })
  }
}
