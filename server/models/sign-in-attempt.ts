import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<number>
  declare email: string
  declare ip: string
  declare succeeded: boolean
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    SignInAttempt.init({
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      ip: { type: DataTypes.STRING(45), allowNull: false },
      succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'sign_in_attempts', underscored: true, updatedAt: false })
  }
}
