import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import type { PackStatus } from '../../shared/schemas/pack'

/** A library item as the pack pinned it: the revision it was issued with, whatever the library says later. */
export interface PinnedItem {
  code: string
  revision: string
  revisionDate: string
  title: string
  collection: string
}

/** One issue of a reply with its library items, calculations, cautions and PDF (revision A, B, …). */
export class ResponsePack extends Model<InferAttributes<ResponsePack>, InferCreationAttributes<ResponsePack>> {
  declare id: CreationOptional<number>
  declare enquiryId: ForeignKey<number>
  declare revision: string
  declare messageId: ForeignKey<number> | null
  declare attachmentId: ForeignKey<number> | null
  declare officerId: ForeignKey<number>
  declare checkerId: ForeignKey<number> | null
  declare status: PackStatus
  declare replyBody: string
  /** JSON text of PinnedItem[]. */
  declare items: string
  /** JSON text of the calculation ids, in the order chosen. */
  declare calculationIds: string
  /** JSON text of the quotation ids, in the order chosen (null on packs composed before quotations could go in). */
  declare quotationIds: string | null
  /** JSON text of the caution kinds. */
  declare cautions: string
  declare createdAt: CreationOptional<Date>
  declare issuedAt: Date | null

  static initModel(sequelize: Sequelize) {
    ResponsePack.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      revision: { type: DataTypes.CHAR(1), allowNull: false },
      messageId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      attachmentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      officerId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      checkerId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'draft' },
      replyBody: { type: DataTypes.TEXT('medium'), allowNull: false },
      items: { type: DataTypes.TEXT, allowNull: false },
      calculationIds: { type: DataTypes.TEXT, allowNull: false },
      quotationIds: { type: DataTypes.TEXT, allowNull: true },
      cautions: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE(3),
      issuedAt: { type: DataTypes.DATE(3), allowNull: true },
    }, {
      sequelize,
      tableName: 'response_packs',
      underscored: true,
      updatedAt: false,
      hooks: {
        // An issued pack is what the requester received; a correction is the next revision, never an edit.
        beforeUpdate(pack) {
          if (pack.previous('status') === 'issued') throw new Error('An issued response pack cannot be changed')
        },
        beforeBulkUpdate() { throw new Error('Response packs are changed one at a time') },
      },
    })
  }
}
