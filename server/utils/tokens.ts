import { createHash, randomBytes } from 'node:crypto'
import type { Transaction } from 'sequelize'
import { Op } from 'sequelize'
import { User, UserToken } from '../models'
import type { TokenPurpose } from '../models/user-token'

const lifetimes: Record<TokenPurpose, number> = {
  'verify-email': 48 * 3600_000,
  'reset-password': 3600_000,
  'invitation': 7 * 24 * 3600_000,
}

const digest = (token: string) => createHash('sha256').update(token).digest('hex')

/** A fresh single-use token (32 random bytes, base64url); earlier unused tokens of the same purpose die with it. */
export async function issueToken(userId: number, purpose: TokenPurpose, transaction: Transaction): Promise<string> {
  const token = randomBytes(32).toString('base64url')
  await UserToken.update({ usedAt: new Date() }, { where: { userId, purpose, usedAt: null }, transaction })
  await UserToken.create({ userId, purpose, tokenHash: digest(token), expiresAt: new Date(Date.now() + lifetimes[purpose]), usedAt: null }, { transaction })
  return token
}

/** Spends a token once: the row is locked, so two clicks on the same link cannot both succeed. */
export async function consumeToken(token: string, purposes: TokenPurpose[], transaction: Transaction): Promise<{ user: User, purpose: TokenPurpose }> {
  const row = await UserToken.findOne({
    where: { tokenHash: digest(token), purpose: { [Op.in]: purposes } },
    lock: transaction.LOCK.UPDATE,
    transaction,
  })
  if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) {
    throw createError({ statusCode: 400, statusMessage: 'This link has expired or has already been used. Ask for a new one.' })
  }
  const user = await User.findByPk(row.userId, { transaction, lock: transaction.LOCK.UPDATE })
  if (!user || user.deactivatedAt) {
    throw createError({ statusCode: 400, statusMessage: 'This link has expired or has already been used. Ask for a new one.' })
  }
  row.usedAt = new Date()
  await row.save({ transaction })
  return { user, purpose: row.purpose }
}
