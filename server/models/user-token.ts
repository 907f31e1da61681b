import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

export type TokenPurpose = 'verify-email' | 'reset-password' | 'invitation'

export class UserToken extends Model<InferAttributes<UserToken>, InferCreationAttributes<UserToken>> {
  declare id: CreationOptional<number>
  declare userId: ForeignKey<number>
  declare purpose: TokenPurpose
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    UserToken.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      purpose: { type: DataTypes.STRING(20), allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
      expiresAt: { type: DataTypes.DATE(3), allowNull: false },
      usedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'user_tokens', underscored: true, updatedAt: false })
  }
}
