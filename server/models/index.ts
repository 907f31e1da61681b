import type { Sequelize } from 'sequelize'
import { Enquiry } from './enquiry'
import { Organisation } from './organisation'
import { Project } from './project'
import { User } from './user'

export { Enquiry, Organisation, Project, User }

let initialised: Sequelize | null = null

/** Registers every model and the associations between them, once per connection. */
export function initModels(sequelize: Sequelize) {
  if (initialised === sequelize) return
  Organisation.initModel(sequelize)
  User.initModel(sequelize)
  Project.initModel(sequelize)
  Enquiry.initModel(sequelize)

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
