import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

/** A calculation saved to an enquiry: inputs, outputs and engine version as run. Immutable once written. */
export class Calculation extends Model<InferAttributes<Calculation>, InferCreationAttributes<Calculation>> {
  declare id: CreationOptional<number>
  declare enquiryId: ForeignKey<number>
  declare method: string
  /** JSON text of the validated inputs. */
  declare inputs: string
  /** JSON text of the outputs the server computed. */
  declare outputs: string
  declare engineVersion: string
  declare createdBy: ForeignKey<number>
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Calculation.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      method: { type: DataTypes.STRING(30), allowNull: false },
      inputs: { type: DataTypes.TEXT('medium'), allowNull: false },
      outputs: { type: DataTypes.TEXT('medium'), allowNull: false },
      engineVersion: { type: DataTypes.STRING(20), allowNull: false },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, field: 'created_by' },
      createdAt: DataTypes.DATE(3),
    }, {
      sequelize,
      tableName: 'calculations',
      underscored: true,
      updatedAt: false,
      hooks: {
        // A saved calculation is evidence of what was answered; a change is a new calculation, never an edit.
        beforeUpdate() { throw new Error('A saved calculation cannot be changed') },
        beforeBulkUpdate() { throw new Error('A saved calculation cannot be changed') },
      },
    })
  }
}
