import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export class Attachment extends Model<InferAttributes<Attachment>, InferCreationAttributes<Attachment>> {
  declare id: CreationOptional<number>
  declare enquiryId: ForeignKey<number>
  declare messageId: ForeignKey<number> | null
  declare storageKey: string
  declare fileName: string
  declare fileType: string
  declare contentType: string
  declare sizeBytes: number
  declare sha256: string
  declare internal: CreationOptional<boolean>
  declare uploadedBy: ForeignKey<number> | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Attachment.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      messageId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      storageKey: { type: DataTypes.STRING(80), allowNull: false },
      fileName: { type: DataTypes.STRING(200), allowNull: false },
      fileType: { type: DataTypes.STRING(10), allowNull: false },
      contentType: { type: DataTypes.STRING(100), allowNull: false },
      sizeBytes: {
        type: DataTypes.BIGINT.UNSIGNED,
        allowNull: false,
        get() { return Number(this.getDataValue('sizeBytes')) },
      },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      internal: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      uploadedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'attachments', underscored: true, updatedAt: false })
  }
}
