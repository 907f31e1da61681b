import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import type { Role } from '../../shared/types/roles'

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>
  declare email: string
  declare name: string
  declare passwordHash: string | null
  declare role: Role
  declare organisationId: ForeignKey<number> | null
  declare phone: string | null
  declare emailVerifiedAt: Date | null
  declare deactivatedAt: Date | null
  declare lastSignInAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    User.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      name: { type: DataTypes.STRING(200), allowNull: false },
      passwordHash: { type: DataTypes.STRING(255), allowNull: true },
      role: { type: DataTypes.ENUM('specifier', 'officer', 'manager', 'admin'), allowNull: false },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      phone: { type: DataTypes.STRING(40), allowNull: true },
      emailVerifiedAt: { type: DataTypes.DATE(3), allowNull: true },
      deactivatedAt: { type: DataTypes.DATE(3), allowNull: true },
      lastSignInAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'users', underscored: true })
  }
}
