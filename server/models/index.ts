import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { ExamModel, initExamModel } from './exam.ts'
import { SignatureModel, initSignatureModel } from './signature.ts'
import { RoundExaminerModel, RoundModel, RoundPatientCodeModel, initRoundModels } from './round.ts'
import { AccountLinkModel, initAccountLinkModel } from './account-link.ts'
import { UserModel, UserRoleModel, initUserModels, withRole } from './user.ts'
import { AgreementPairModel, initAgreementPairModel } from './agreement-pair.ts'
import { AttachmentModel, initAttachmentModel } from './attachment.ts'
import { SettingsVersionModel, initSettingsVersionModel } from './settings-version.ts'
import { ReferenceModel, initReferenceModel } from './reference.ts'
import { RateLimitHitModel, initRateLimitHitModel } from './rate-limit-hit.ts'

export { UserModel, UserRoleModel, withRole }
export { ExamModel }
export { SignatureModel }
export { RoundModel, RoundPatientCodeModel, RoundExaminerModel }
export { AccountLinkModel }
export { AgreementPairModel }
export { AttachmentModel }
export { SettingsVersionModel }
export { ReferenceModel }
export { RateLimitHitModel }

export class TeamModel extends Model<InferAttributes<TeamModel>, InferCreationAttributes<TeamModel>> {
  declare id: string
  declare name: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class MembershipModel extends Model<InferAttributes<MembershipModel>, InferCreationAttributes<MembershipModel>> {
  declare userId: string
  declare teamId: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class RefreshSessionModel extends Model<
  InferAttributes<RefreshSessionModel>,
  InferCreationAttributes<RefreshSessionModel>
> {
  declare id: string
  declare userId: string
  declare familyId: string
  declare tokenHash: string
  declare expiresAt: Date
  declare revokedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

export class AuditEventModel extends Model<InferAttributes<AuditEventModel>, InferCreationAttributes<AuditEventModel>> {
  declare id: CreationOptional<number>
  declare at: Date
  declare actorId: string | null
  declare action: string
  declare entityType: string | null
  declare entityId: string | null
  declare changes: string | null
}

export type Models = ReturnType<typeof initModels>

/** Binds every model class to a connection, in this one place; the tables themselves come from migrations. */
export function initModels(sequelize: Sequelize) {
  const id = { type: DataTypes.STRING(36), primaryKey: true }
  const stamps = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE }
  initUserModels(sequelize)
  TeamModel.init({ id, name: DataTypes.STRING, ...stamps }, { sequelize, tableName: 'teams' })
  MembershipModel.init(
    {
      userId: { type: DataTypes.STRING(36), primaryKey: true },
      teamId: { type: DataTypes.STRING(36), primaryKey: true },
      ...stamps,
    },
    { sequelize, tableName: 'team_memberships' },
  )
  RefreshSessionModel.init(
    {
      id,
      userId: DataTypes.STRING,
      familyId: DataTypes.STRING,
      tokenHash: DataTypes.STRING,
      expiresAt: DataTypes.DATE,
      revokedAt: DataTypes.DATE,
      ...stamps,
    },
    { sequelize, tableName: 'refresh_sessions' },
  )
  AuditEventModel.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      at: DataTypes.DATE,
      actorId: DataTypes.STRING,
      action: DataTypes.STRING,
      entityType: DataTypes.STRING,
      entityId: DataTypes.STRING,
      changes: DataTypes.TEXT,
    },
    { sequelize, tableName: 'audit_events', timestamps: false },
  )
  initExamModel(sequelize)
  initSignatureModel(sequelize)
  initRoundModels(sequelize)
  initAccountLinkModel(sequelize)
  initAgreementPairModel(sequelize)
  initAttachmentModel(sequelize)
  initSettingsVersionModel(sequelize)
  initReferenceModel(sequelize)
  initRateLimitHitModel(sequelize)
  return {
    UserModel,
    UserRoleModel,
    TeamModel,
    MembershipModel,
    RefreshSessionModel,
    AuditEventModel,
    ExamModel,
    SignatureModel,
    RoundModel,
    RoundPatientCodeModel,
    RoundExaminerModel,
    AccountLinkModel,
    AgreementPairModel,
    AttachmentModel,
    SettingsVersionModel,
    ReferenceModel,
    RateLimitHitModel,
  }
}
