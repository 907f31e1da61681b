import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<number>
  declare organisationId: ForeignKey<number> | null
  declare name: string
  declare siteAddress: string | null
  declare region: string | null
  declare stage: string
  declare buildingType: string | null
  declare storeys: number | null
  declare wallAreaM2: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Project.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      name: { type: DataTypes.STRING(200), allowNull: false },
      siteAddress: { type: DataTypes.STRING(400), allowNull: true },
      region: { type: DataTypes.STRING(80), allowNull: true },
      stage: { type: DataTypes.STRING(20), allowNull: false },
      buildingType: { type: DataTypes.STRING(80), allowNull: true },
      storeys: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
      // DECIMAL comes back from the driver as a string; keep the model's promise of a number.
      wallAreaM2: {
        type: DataTypes.DECIMAL(10, 1),
        allowNull: true,
        field: 'wall_area_m2',
        get() {
          const raw = this.getDataValue('wallAreaM2') as unknown
          return raw === null || raw === undefined ? null : Number(raw)
        },
      },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'projects', underscored: true })
  }
}
