import type { Sequelize } from 'sequelize'
import { AuditEvent } from './audit-event'
import { Enquiry } from './enquiry'
import { Organisation } from './organisation'
import { OutboxMessage } from './outbox-message'
import { Project } from './project'
import { SignInAttempt } from './sign-in-attempt'
import { User } from './user'
import { UserToken } from './user-token'

export { AuditEvent, Enquiry, Organisation, OutboxMessage, Project, SignInAttempt, User, UserToken }

let initialised: Sequelize | null = null

/** Registers every model and the associations between them, once per connection. */
export function initModels(sequelize: Sequelize) {
  if (initialised === sequelize) return
  Organisation.initModel(sequelize)
  User.initModel(sequelize)
  Project.initModel(sequelize)
  Enquiry.initModel(sequelize)
  UserToken.initModel(sequelize)
  SignInAttempt.initModel(sequelize)
  AuditEvent.initModel(sequelize)
  OutboxMessage.initModel(sequelize)

  Organisation.hasMany(User, { foreignKey: 'organisationId', as: 'members' })
  User.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' })
  Organisation.hasMany(Project, { foreignKey: 'organisationId', as: 'projects' })
  Project.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' })
  Enquiry.belongsTo(Project, { foreignKey: 'projectId', as: 'project' })
  Enquiry.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' })
  Enquiry.belongsTo(User, { foreignKey: 'assigneeId', as: 'assignee' })
  Enquiry.belongsTo(User, { foreignKey: 'requesterUserId', as: 'requester' })
  initialised = sequelize
}
