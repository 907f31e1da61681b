import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export type OutboxStatus = 'pending' | 'sent' | 'failed'

export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>
  declare kind: string
  declare toAddress: string
  declare subject: string
  declare textBody: string
  declare htmlBody: string | null
  declare headers: string | null
  declare messageId: string
  declare enquiryId: ForeignKey<number> | null
  /** JSON text of stored Attachment ids sent with the message (a response pack's PDF). */
  declare attachmentIds: CreationOptional<string | null>
  declare status: CreationOptional<OutboxStatus>
  declare attempts: CreationOptional<number>
  declare nextAttemptAt: CreationOptional<Date>
  declare lastError: string | null
  declare sentAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    OutboxMessage.init({
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      kind: { type: DataTypes.STRING(30), allowNull: false },
      toAddress: { type: DataTypes.STRING(254), allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      textBody: { type: DataTypes.TEXT('medium'), allowNull: false },
      htmlBody: { type: DataTypes.TEXT('medium'), allowNull: true },
      headers: { type: DataTypes.TEXT, allowNull: true },
      messageId: { type: DataTypes.STRING(250), allowNull: false },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      attachmentIds: { type: DataTypes.TEXT, allowNull: true },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' },
      attempts: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
      nextAttemptAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      lastError: { type: DataTypes.STRING(500), allowNull: true },
      sentAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'outbox_messages', underscored: true, updatedAt: false })
  }
}
