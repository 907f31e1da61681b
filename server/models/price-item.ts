import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import type { PriceItemKind } from '../../shared/workbench/quotation'

/** One line of the price book: a product, a labour rate or a delivery zone, priced in integer cents. */
export class PriceItem extends Model<InferAttributes<PriceItem>, InferCreationAttributes<PriceItem>> {
  declare code: string
  declare description: string
  declare unit: string
  declare unitPriceCents: number
  declare packSize: number | null
  declare kind: PriceItemKind
  declare active: CreationOptional<boolean>
  /** True for the invented prices seeded for the demonstration. */
  declare demo: CreationOptional<boolean>
  declare updatedBy: ForeignKey<number> | null
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    PriceItem.init({
      code: { type: DataTypes.STRING(60), primaryKey: true },
      description: { type: DataTypes.STRING(200), allowNull: false },
      unit: { type: DataTypes.STRING(20), allowNull: false },
      unitPriceCents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      packSize: {
        type: DataTypes.DECIMAL(12, 3),
        allowNull: true,
        // MariaDB hands DECIMAL back as a string.
        get() {
          const v = this.getDataValue('packSize') as unknown
          return v === null || v === undefined ? null : Number(v)
        },
      },
      kind: { type: DataTypes.ENUM('material', 'labour-lay', 'labour-system', 'delivery'), allowNull: false },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'price_items', underscored: true, createdAt: false })
  }
}
