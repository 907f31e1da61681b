import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

/** Why a mail was held: nothing to thread it onto, a sender the enquiry does not know, or an automatic reply. */
export type QuarantineReason = 'no-match' | 'unknown-sender' | 'auto-reply'
export type QuarantineStatus = 'held' | 'released' | 'discarded'

export class InboundQuarantine extends Model<InferAttributes<InboundQuarantine>, InferCreationAttributes<InboundQuarantine>> {
  declare id: CreationOptional<number>
  declare receivedAt: CreationOptional<Date>
  declare fromAddress: string
  declare toAddresses: string
  declare subject: string
  declare reason: QuarantineReason
  declare rawSize: number
  declare rawKey: string | null
  declare messageId: string | null
  declare textBody: string
  declare attachmentList: string | null
  declare enquiryId: ForeignKey<number> | null
  declare status: CreationOptional<QuarantineStatus>
  declare decidedBy: ForeignKey<number> | null
  declare decidedAt: Date | null

  static initModel(sequelize: Sequelize) {
    InboundQuarantine.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      receivedAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      fromAddress: { type: DataTypes.STRING(254), allowNull: false },
      toAddresses: { type: DataTypes.STRING(1000), allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      reason: { type: DataTypes.STRING(20), allowNull: false },
      rawSize: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      rawKey: { type: DataTypes.STRING(80), allowNull: true },
      messageId: { type: DataTypes.STRING(250), allowNull: true },
      textBody: { type: DataTypes.TEXT('medium'), allowNull: false },
      attachmentList: { type: DataTypes.TEXT, allowNull: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'held' },
      decidedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      decidedAt: { type: DataTypes.DATE(3), allowNull: true },
    }, { sequelize, tableName: 'inbound_quarantine', underscored: true, timestamps: false })
  }
}
