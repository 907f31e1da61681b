import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

const money = (field: 'subtotalCents' | 'discountCents' | 'deliveryCents' | 'vatCents' | 'totalCents') => ({
  type: DataTypes.BIGINT.UNSIGNED,
  allowNull: false,
  get(this: Quotation) { return Number(this.getDataValue(field)) },
})
const percent = (field: 'discountPercent' | 'vatPercent') => ({
  type: DataTypes.DECIMAL(5, 2),
  allowNull: false,
  get(this: Quotation) { return Number(this.getDataValue(field)) },
})

/** One revision of a quotation on an enquiry, with its priced lines and its PDF. Immutable once written. */
export class Quotation extends Model<InferAttributes<Quotation>, InferCreationAttributes<Quotation>> {
  declare id: CreationOptional<number>
  declare enquiryId: ForeignKey<number>
  declare revision: string
  declare scope: string
  /** JSON text of the validated request (quantities input, rates, validity). */
  declare inputs: string
  /** JSON text of the priced lines. */
  declare lines: string
  declare discountPercent: number
  declare vatPercent: number
  declare validUntil: string
  declare subtotalCents: number
  declare discountCents: number
  declare deliveryCents: number
  declare vatCents: number
  declare totalCents: number
  declare createdBy: ForeignKey<number>
  declare createdAt: CreationOptional<Date>
  declare attachmentId: ForeignKey<number> | null

  static initModel(sequelize: Sequelize) {
    Quotation.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      revision: { type: DataTypes.CHAR(1), allowNull: false },
      scope: { type: DataTypes.STRING(20), allowNull: false },
      inputs: { type: DataTypes.TEXT('medium'), allowNull: false },
      lines: { type: DataTypes.TEXT('medium'), allowNull: false },
      discountPercent: percent('discountPercent'),
      vatPercent: percent('vatPercent'),
      validUntil: { type: DataTypes.DATEONLY, allowNull: false },
      subtotalCents: money('subtotalCents'),
      discountCents: money('discountCents'),
      deliveryCents: money('deliveryCents'),
      vatCents: money('vatCents'),
      totalCents: money('totalCents'),
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, field: 'created_by' },
      createdAt: DataTypes.DATE(3),
      attachmentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    }, {
      sequelize,
      tableName: 'quotations',
      underscored: true,
      updatedAt: false,
      hooks: {
        // A quotation sent out is a record of what was offered; a change is the next revision, never an edit.
        beforeUpdate() { throw new Error('A saved quotation cannot be changed; create the next revision') },
        beforeBulkUpdate() { throw new Error('A saved quotation cannot be changed; create the next revision') },
      },
    })
  }
}
