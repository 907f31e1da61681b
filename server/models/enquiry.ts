import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

// BIGINT columns come back from the driver as bigint or string; the durations fit a double exactly.
const nullableNumber = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v))

export class Enquiry extends Model<InferAttributes<Enquiry>, InferCreationAttributes<Enquiry>> {
  declare id: CreationOptional<number>
  declare ref: string
  declare refYear: number
  declare refSeq: number
  declare status: CreationOptional<string>
  declare topic: string
  declare priority: CreationOptional<string>
  declare subject: string
  declare question: string
  declare requesterUserId: ForeignKey<number> | null
  declare requesterName: string
  declare requesterEmail: string
  declare requesterPhone: string | null
  declare requesterOrganisation: string | null
  declare organisationId: ForeignKey<number> | null
  declare projectId: ForeignKey<number> | null
  declare assigneeId: ForeignKey<number> | null
  declare receivedAt: CreationOptional<Date>
  declare firstResponseAt: Date | null
  declare answeredAt: Date | null
  declare closedAt: Date | null
  declare mergedIntoId: ForeignKey<number> | null
  declare replyToken: string | null
  declare firstResponseDueAt: Date | null
  declare answerDueAt: Date | null
  declare nextDueAt: Date | null
  declare waitingSince: Date | null
  /** When the requester was reminded during the current wait; cleared whenever a new wait starts. */
  declare remindedAt: CreationOptional<Date | null>
  /** Working time to the first reply and to the answer, stored when each clock stops (shared/time/stopped-clock.ts). */
  declare firstResponseWorkingMs: CreationOptional<number | null>
  declare answerWorkingMs: CreationOptional<number | null>
  declare lastActivityAt: CreationOptional<Date>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Enquiry.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      ref: { type: DataTypes.STRING(20), allowNull: false },
      refYear: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      refSeq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'received' },
      topic: { type: DataTypes.STRING(30), allowNull: false },
      priority: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'normal' },
      subject: { type: DataTypes.STRING(200), allowNull: false },
      question: { type: DataTypes.TEXT, allowNull: false },
      requesterUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      requesterName: { type: DataTypes.STRING(200), allowNull: false },
      requesterEmail: { type: DataTypes.STRING(254), allowNull: false },
      requesterPhone: { type: DataTypes.STRING(40), allowNull: true },
      requesterOrganisation: { type: DataTypes.STRING(200), allowNull: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      projectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      assigneeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      receivedAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      firstResponseAt: { type: DataTypes.DATE(3), allowNull: true },
      answeredAt: { type: DataTypes.DATE(3), allowNull: true },
      closedAt: { type: DataTypes.DATE(3), allowNull: true },
      mergedIntoId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      replyToken: { type: DataTypes.CHAR(32), allowNull: true },
      firstResponseDueAt: { type: DataTypes.DATE(3), allowNull: true },
      answerDueAt: { type: DataTypes.DATE(3), allowNull: true },
      nextDueAt: { type: DataTypes.DATE(3), allowNull: true },
      waitingSince: { type: DataTypes.DATE(3), allowNull: true },
      remindedAt: { type: DataTypes.DATE(3), allowNull: true },
      firstResponseWorkingMs: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true, get() { return nullableNumber(this.getDataValue('firstResponseWorkingMs')) } },
      answerWorkingMs: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true, get() { return nullableNumber(this.getDataValue('answerWorkingMs')) } },
      lastActivityAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'enquiries', underscored: true })
  }
}
