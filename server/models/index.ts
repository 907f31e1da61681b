import type { Sequelize } from 'sequelize'
import { Attachment } from './attachment'
import { AuditEvent } from './audit-event'
import { Calculation } from './calculation'
import { Enquiry } from './enquiry'
import { EnquiryEvent } from './enquiry-event'
import { EnquiryMessage } from './enquiry-message'
import { InboundQuarantine } from './inbound-quarantine'
import { LibraryOverride } from './library-override'
import { Organisation } from './organisation'
import { OutboxMessage } from './outbox-message'
import { PriceItem } from './price-item'
import { Project } from './project'
import { Quotation } from './quotation'
import { ResponsePack } from './response-pack'
import { ServiceTarget } from './service-target'
import { SignInAttempt } from './sign-in-attempt'
import { User } from './user'
import { UserToken } from './user-token'

export { Attachment, AuditEvent, Calculation, Enquiry, EnquiryEvent, EnquiryMessage, InboundQuarantine, LibraryOverride, Organisation, OutboxMessage, PriceItem, Project, Quotation, ResponsePack, ServiceTarget, SignInAttempt, User, UserToken }

let initialised: Sequelize | null = null

/** Registers every model and the associations between them, once per connection. */
export function initModels(sequelize: Sequelize) {
  if (initialised === sequelize) return
  Organisation.initModel(sequelize)
  User.initModel(sequelize)
  Project.initModel(sequelize)
  Enquiry.initModel(sequelize)
  UserToken.initModel(sequelize)
  EnquiryMessage.initModel(sequelize)
  EnquiryEvent.initModel(sequelize)
  Attachment.initModel(sequelize)
  ServiceTarget.initModel(sequelize)
  SignInAttempt.initModel(sequelize)
  AuditEvent.initModel(sequelize)
  OutboxMessage.initModel(sequelize)
  Calculation.initModel(sequelize)
  LibraryOverride.initModel(sequelize)
  InboundQuarantine.initModel(sequelize)
  ResponsePack.initModel(sequelize)
  PriceItem.initModel(sequelize)
  Quotation.initModel(sequelize)

  Organisation.hasMany(User, { foreignKey: 'organisationId', as: 'members' })
  User.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' })
  Organisation.hasMany(Project, { foreignKey: 'organisationId', as: 'projects' })
  Project.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' })
  Enquiry.belongsTo(Project, { foreignKey: 'projectId', as: 'project' })
  Enquiry.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' })
  Enquiry.belongsTo(User, { foreignKey: 'assigneeId', as: 'assignee' })
  Enquiry.belongsTo(User, { foreignKey: 'requesterUserId', as: 'requester' })
  Enquiry.hasMany(Calculation, { foreignKey: 'enquiryId', as: 'calculations' })
  Calculation.belongsTo(Enquiry, { foreignKey: 'enquiryId', as: 'enquiry' })
  Calculation.belongsTo(User, { foreignKey: 'createdBy', as: 'author' })
  LibraryOverride.belongsTo(User, { foreignKey: 'setBy', as: 'setter' })
  Enquiry.hasMany(EnquiryMessage, { foreignKey: 'enquiryId', as: 'messages' })
  EnquiryMessage.belongsTo(Enquiry, { foreignKey: 'enquiryId', as: 'enquiry' })
  Enquiry.hasMany(EnquiryEvent, { foreignKey: 'enquiryId', as: 'events' })
  Enquiry.hasMany(Attachment, { foreignKey: 'enquiryId', as: 'attachments' })
  EnquiryMessage.hasMany(Attachment, { foreignKey: 'messageId', as: 'attachments' })
  InboundQuarantine.belongsTo(Enquiry, { foreignKey: 'enquiryId', as: 'enquiry' })
  Enquiry.hasMany(ResponsePack, { foreignKey: 'enquiryId', as: 'packs' })
  ResponsePack.belongsTo(User, { foreignKey: 'officerId', as: 'officer' })
  ResponsePack.belongsTo(User, { foreignKey: 'checkerId', as: 'checker' })
  ResponsePack.belongsTo(Attachment, { foreignKey: 'attachmentId', as: 'attachment' })
  Enquiry.hasMany(Quotation, { foreignKey: 'enquiryId', as: 'quotations' })
  Quotation.belongsTo(User, { foreignKey: 'createdBy', as: 'author' })
  Quotation.belongsTo(Attachment, { foreignKey: 'attachmentId', as: 'attachment' })
  initialised = sequelize
}
