import type { Sequelize } from 'sequelize';
import { ApiToken } from './ApiToken';
import { Assessment } from './Assessment';
import { AssessmentRisk } from './AssessmentRisk';
import { Asset } from './Asset';
import { AssetShare } from './AssetShare';
import { Attachment } from './Attachment';
import { AuditEvent } from './AuditEvent';
import { CarbonationTest } from './CarbonationTest';
import { CustomPopulation } from './CustomPopulation';
import { ChlorideIncrement } from './ChlorideIncrement';
import { ChlorideProfile } from './ChlorideProfile';
import { ColumnTemplate } from './ColumnTemplate';
import { ImportBatch } from './ImportBatch';
import { ImportProgress } from './ImportProgress';
import { Invitation } from './Invitation';
import { MailMessage } from './MailMessage';
import { Member } from './Member';
import { MemberCoverSet } from './MemberCoverSet';
import { Membership } from './Membership';
import { Organisation } from './Organisation';
import { PasswordReset } from './PasswordReset';
import { Reading } from './Reading';
import { ReportLink } from './ReportLink';
import { ResearchExport } from './ResearchExport';
import { Session } from './Session';
import { SignInThrottle } from './SignInThrottle';
import { Survey } from './Survey';
import { SurveyPlan } from './SurveyPlan';
import { SyncBatch } from './SyncBatch';
import { User } from './User';
import { VerificationHole } from './VerificationHole';

export {
	ApiToken,
	Assessment,
	AssessmentRisk,
	Asset,
	AssetShare,
	Attachment,
	AuditEvent,
	CarbonationTest,
	CustomPopulation,
	ChlorideIncrement,
	ChlorideProfile,
	ColumnTemplate,
	ImportBatch,
	ImportProgress,
	Invitation,
	MailMessage,
	Member,
	MemberCoverSet,
	Membership,
	Organisation,
	PasswordReset,
	Reading,
	ReportLink,
	ResearchExport,
	Session,
	SignInThrottle,
	Survey,
	SurveyPlan,
	SyncBatch,
	User,
	VerificationHole
};

const allModels = [
	ApiToken,
	Assessment,
	AssessmentRisk,
	Asset,
	AssetShare,
	Attachment,
	AuditEvent,
	CarbonationTest,
	CustomPopulation,
	ChlorideIncrement,
	ChlorideProfile,
	ColumnTemplate,
	ImportBatch,
	ImportProgress,
	Invitation,
	MailMessage,
	Member,
	MemberCoverSet,
	Membership,
	Organisation,
	PasswordReset,
	Reading,
	ReportLink,
	ResearchExport,
	Session,
	SignInThrottle,
	Survey,
	SurveyPlan,
	SyncBatch,
	User,
	VerificationHole
];

let initialisedFor: Sequelize | null = null;

/** Binds every model to `sequelize` and declares the associations, once per instance. */
export function initModels(sequelize: Sequelize): void {
	if (initialisedFor === sequelize) return;
	for (const model of allModels) model.initModel(sequelize);
	associate();
	initialisedFor = sequelize;
}

function associate(): void {
	Organisation.hasMany(Membership, { foreignKey: 'organisationId' });
	Membership.belongsTo(Organisation, { foreignKey: 'organisationId' });
	User.hasMany(Membership, { foreignKey: 'userId' });
	Membership.belongsTo(User, { foreignKey: 'userId' });
	Session.belongsTo(User, { foreignKey: 'userId' });
	ApiToken.belongsTo(User, { foreignKey: 'userId' });

	Organisation.hasMany(Asset, { foreignKey: 'organisationId' });
	Asset.belongsTo(Organisation, { foreignKey: 'organisationId' });
	Asset.hasMany(AssetShare, { foreignKey: 'assetId' });
	AssetShare.belongsTo(Asset, { foreignKey: 'assetId' });
	AssetShare.belongsTo(Organisation, { foreignKey: 'organisationId' });

	Asset.hasMany(Survey, { foreignKey: 'assetId' });
	Asset.hasMany(CustomPopulation, { foreignKey: 'assetId' });
	CustomPopulation.belongsTo(Asset, { foreignKey: 'assetId' });
	Survey.belongsTo(Asset, { foreignKey: 'assetId' });
	Survey.hasMany(Member, { foreignKey: 'surveyId' });
	Member.belongsTo(Survey, { foreignKey: 'surveyId' });
	Member.belongsTo(Asset, { foreignKey: 'assetId' });
	Member.hasMany(Reading, { foreignKey: 'memberId' });
	Reading.belongsTo(Member, { foreignKey: 'memberId' });
	Member.hasMany(VerificationHole, { foreignKey: 'memberId' });
	VerificationHole.belongsTo(Member, { foreignKey: 'memberId' });
	Member.hasMany(CarbonationTest, { foreignKey: 'memberId' });
	CarbonationTest.belongsTo(Member, { foreignKey: 'memberId' });
	Member.hasMany(ChlorideProfile, { foreignKey: 'memberId' });
	ChlorideProfile.belongsTo(Member, { foreignKey: 'memberId' });
	ChlorideProfile.hasMany(ChlorideIncrement, { foreignKey: 'profileId', as: 'increments' });

	Survey.hasOne(SurveyPlan, { foreignKey: 'surveyId' });
	SurveyPlan.belongsTo(Survey, { foreignKey: 'surveyId' });
	Survey.hasMany(ImportBatch, { foreignKey: 'surveyId' });
	ImportBatch.belongsTo(Survey, { foreignKey: 'surveyId' });
	ImportBatch.hasOne(ImportProgress, { foreignKey: 'importBatchId' });
	Survey.hasMany(Attachment, { foreignKey: 'surveyId' });
	Attachment.belongsTo(Survey, { foreignKey: 'surveyId' });

	Asset.hasMany(Assessment, { foreignKey: 'assetId' });
	Assessment.belongsTo(Asset, { foreignKey: 'assetId' });
	Assessment.belongsTo(Survey, { foreignKey: 'surveyId' });
	Assessment.hasMany(ReportLink, { foreignKey: 'assessmentId' });
	Assessment.hasOne(AssessmentRisk, { foreignKey: 'assessmentId' });
	ReportLink.belongsTo(Assessment, { foreignKey: 'assessmentId' });
}
