import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

// Sequelize model definitions and associations. The schema itself is owned by migrations/;
// these classes only describe it (no sync()).

export const TEAM_ROLES = ['owner', 'editor', 'reviewer', 'viewer'] as const;
export type TeamRole = (typeof TEAM_ROLES)[number];
export const REVIEW_STATUSES = ['unsigned', 'in_review', 'checked', 'approved', 'returned'] as const;
export type ReviewStatus = (typeof REVIEW_STATUSES)[number];

export class Team extends Model<InferAttributes<Team>, InferCreationAttributes<Team>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string;
  declare currentTeamId: ForeignKey<Team['id']> | null;
  declare passwordChangedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare userId: ForeignKey<User['id']>;
  declare role: TeamRole;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** Display preferences of a sheet, outside its document (CONTRACT §6b); absent means the defaults. */
export class SheetPreference extends Model<InferAttributes<SheetPreference>, InferCreationAttributes<SheetPreference>> {
  declare sheetId: string;
  declare significantFigures: CreationOptional<number>;
  declare siFolded: CreationOptional<boolean>;
  declare updatedBy: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Sheet extends Model<InferAttributes<Sheet>, InferCreationAttributes<Sheet>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare title: string;
  declare siteName: string | null;
  declare siteLatitude: number | null;
  declare siteLongitude: number | null;
  declare siteNotes: string | null;
  declare draftDocument: unknown;
  declare draftVersion: CreationOptional<number>;
  declare headRevision: CreationOptional<number>;
  declare createdBy: ForeignKey<User['id']>;
  declare updatedBy: ForeignKey<User['id']> | null;
  declare forkedFromSheetId: string | null;
  declare forkedFromRevision: number | null;
  declare archivedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class SheetRevision extends Model<InferAttributes<SheetRevision>, InferCreationAttributes<SheetRevision>> {
  declare id: CreationOptional<string>;
  declare sheetId: ForeignKey<Sheet['id']>;
  declare number: number;
  declare document: unknown;
  declare hash: string;
  declare engineVersion: string;
  declare results: unknown;
  declare authorId: ForeignKey<User['id']>;
  declare message: string;
  declare reviewStatus: CreationOptional<ReviewStatus>;
  declare reviewRequestedBy: string | null;
  declare reviewRequestedAt: Date | null;
  declare reviewerId: string | null;
  declare checkedBy: string | null;
  declare checkedAt: Date | null;
  declare approvedBy: string | null;
  declare approvedAt: Date | null;
  declare returnedBy: string | null;
  declare returnedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
  declare id: CreationOptional<string>;
  declare sheetId: ForeignKey<Sheet['id']>;
  declare blockId: string;
  declare revision: number;
  declare parentId: string | null;
  declare authorId: ForeignKey<User['id']>;
  declare body: string;
  declare resolvedAt: Date | null;
  declare resolvedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** An immutable, team-owned table of measurements (CONTRACT §7), identified by its canonical SHA-256. */
export class Dataset extends Model<InferAttributes<Dataset>, InferCreationAttributes<Dataset>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare sha256: string;
  declare kind: 'slope_profile' | 'long_profile';
  declare name: string;
  declare description: string;
  declare columns: { name: string; unit: string }[];
  /** The RFC 8785 text of the canonical form (the bytes that are hashed). */
  declare canonical: string;
  declare canonicalBytes: number;
  declare rowCount: number;
  /** The uploaded file as it came. */
  declare original: Buffer;
  declare originalSha256: string;
  declare originalFilename: string | null;
  /** Size of the uploaded file in bytes. */
  declare byteSize: number;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
}

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare email: string;
  declare role: TeamRole;
  declare tokenHash: string;
  declare invitedBy: ForeignKey<User['id']>;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare acceptedBy: string | null;
  declare createdAt: CreationOptional<Date>;
}

export class PasswordReset extends Model<InferAttributes<PasswordReset>, InferCreationAttributes<PasswordReset>> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User['id']>;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

export class QuickCalculation extends Model<InferAttributes<QuickCalculation>, InferCreationAttributes<QuickCalculation>> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User['id']>;
  declare expression: string;
  declare result: unknown;
  declare createdAt: CreationOptional<Date>;
}

export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<string>;
  declare teamId: string | null;
  declare actorId: string | null;
  declare action: string;
  declare subjectType: string;
  declare subjectId: string | null;
  declare details: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
}

const uuidPk = { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 };
const created = { type: DataTypes.DATE, allowNull: false };

let initialised: Sequelize | null = null;

/** Describes every table on the given instance, once per instance. */
export function initModels(sequelize: Sequelize): void {
  if (initialised === sequelize) return;
  initialised = sequelize;
  // The model name is given explicitly: a production bundle renames classes (class b extends Model),
  // and Sequelize would otherwise take those one-letter names for model and association names.
  const MODEL_NAMES: Record<string, string> = {
    teams: 'Team',
    users: 'User',
    memberships: 'Membership',
    sheets: 'Sheet',
    sheet_revisions: 'SheetRevision',
    comments: 'Comment',
    datasets: 'Dataset',
    invitations: 'Invitation',
    password_resets: 'PasswordReset',
    quick_calculations: 'QuickCalculation',
    audit_log: 'AuditEntry',
    sheet_preferences: 'SheetPreference',
  };
  const opts = (tableName: string, timestamps: 'both' | 'created' = 'both') => ({
    modelName: MODEL_NAMES[tableName],
    sequelize,
    tableName,
    underscored: true,
    timestamps: true,
    updatedAt: timestamps === 'both' ? 'updatedAt' : false,
  } as const);

  Team.init(
    { id: uuidPk, name: { type: DataTypes.TEXT, allowNull: false }, createdAt: created, updatedAt: created },
    opts('teams'),
  );
  User.init(
    {
      id: uuidPk,
      email: { type: DataTypes.TEXT, allowNull: false, unique: true },
      name: { type: DataTypes.TEXT, allowNull: false },
      passwordHash: { type: DataTypes.TEXT, allowNull: false },
      currentTeamId: { type: DataTypes.UUID, allowNull: true },
      passwordChangedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: created,
      updatedAt: created,
    },
    opts('users'),
  );
  Membership.init(
    {
      id: uuidPk,
      teamId: { type: DataTypes.UUID, allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      role: { type: DataTypes.ENUM(...TEAM_ROLES), allowNull: false },
      createdAt: created,
      updatedAt: created,
    },
    opts('memberships'),
  );
  Sheet.init(
    {
      id: uuidPk,
      teamId: { type: DataTypes.UUID, allowNull: false },
      title: { type: DataTypes.TEXT, allowNull: false },
      siteName: DataTypes.TEXT,
      siteLatitude: DataTypes.DOUBLE,
      siteLongitude: DataTypes.DOUBLE,
      siteNotes: DataTypes.TEXT,
      draftDocument: { type: DataTypes.JSONB, allowNull: false },
      draftVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      headRevision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      createdBy: { type: DataTypes.UUID, allowNull: false },
      updatedBy: DataTypes.UUID,
      forkedFromSheetId: DataTypes.UUID,
      forkedFromRevision: DataTypes.INTEGER,
      archivedAt: DataTypes.DATE,
      createdAt: created,
      updatedAt: created,
    },
    opts('sheets'),
  );
  SheetRevision.init(
    {
      id: uuidPk,
      sheetId: { type: DataTypes.UUID, allowNull: false },
      number: { type: DataTypes.INTEGER, allowNull: false },
      document: { type: DataTypes.JSONB, allowNull: false },
      hash: { type: DataTypes.CHAR(64), allowNull: false },
      engineVersion: { type: DataTypes.TEXT, allowNull: false },
      // NULL while the revision's long run is evaluating it (CONTRACT §6b).
      results: { type: DataTypes.JSONB, allowNull: true },
      authorId: { type: DataTypes.UUID, allowNull: false },
      message: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      reviewStatus: { type: DataTypes.ENUM(...REVIEW_STATUSES), allowNull: false, defaultValue: 'unsigned' },
      reviewRequestedBy: DataTypes.UUID,
      reviewRequestedAt: DataTypes.DATE,
      reviewerId: DataTypes.UUID,
      checkedBy: DataTypes.UUID,
      checkedAt: DataTypes.DATE,
      approvedBy: DataTypes.UUID,
      approvedAt: DataTypes.DATE,
      returnedBy: DataTypes.UUID,
      returnedAt: DataTypes.DATE,
      createdAt: created,
    },
    opts('sheet_revisions', 'created'),
  );
  Comment.init(
    {
      id: uuidPk,
      sheetId: { type: DataTypes.UUID, allowNull: false },
      blockId: { type: DataTypes.TEXT, allowNull: false },
      revision: { type: DataTypes.INTEGER, allowNull: false },
      parentId: DataTypes.UUID,
      authorId: { type: DataTypes.UUID, allowNull: false },
      body: { type: DataTypes.TEXT, allowNull: false },
      resolvedAt: DataTypes.DATE,
      resolvedBy: DataTypes.UUID,
      createdAt: created,
      updatedAt: created,
    },
    opts('comments'),
  );
  Dataset.init(
    {
      id: uuidPk,
      teamId: { type: DataTypes.UUID, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      kind: { type: DataTypes.TEXT, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      columns: { type: DataTypes.JSONB, allowNull: false },
      canonical: { type: DataTypes.TEXT, allowNull: false },
      canonicalBytes: { type: DataTypes.INTEGER, allowNull: false },
      rowCount: { type: DataTypes.INTEGER, allowNull: false },
      original: { type: DataTypes.BLOB, allowNull: false },
      originalSha256: { type: DataTypes.CHAR(64), allowNull: false },
      originalFilename: { type: DataTypes.TEXT, allowNull: true },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
      createdBy: { type: DataTypes.UUID, allowNull: true },
      createdAt: created,
    },
    opts('datasets', 'created'),
  );
  Invitation.init(
    {
      id: uuidPk,
      teamId: { type: DataTypes.UUID, allowNull: false },
      email: { type: DataTypes.TEXT, allowNull: false },
      role: { type: DataTypes.ENUM(...TEAM_ROLES), allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
      invitedBy: { type: DataTypes.UUID, allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: DataTypes.DATE,
      acceptedBy: DataTypes.UUID,
      createdAt: created,
    },
    opts('invitations', 'created'),
  );
  PasswordReset.init(
    {
      id: uuidPk,
      userId: { type: DataTypes.UUID, allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: DataTypes.DATE,
      createdAt: created,
    },
    opts('password_resets', 'created'),
  );
  QuickCalculation.init(
    {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      userId: { type: DataTypes.UUID, allowNull: false },
      expression: { type: DataTypes.TEXT, allowNull: false },
      result: { type: DataTypes.JSONB, allowNull: false },
      createdAt: created,
    },
    opts('quick_calculations', 'created'),
  );
  AuditEntry.init(
    {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      teamId: DataTypes.UUID,
      actorId: DataTypes.UUID,
      action: { type: DataTypes.TEXT, allowNull: false },
      subjectType: { type: DataTypes.TEXT, allowNull: false },
      subjectId: DataTypes.TEXT,
      details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      createdAt: created,
    },
    opts('audit_log', 'created'),
  );

  SheetPreference.init(
    {
      sheetId: { type: DataTypes.UUID, primaryKey: true },
      significantFigures: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 4 },
      siFolded: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      updatedBy: DataTypes.UUID,
      createdAt: created,
      updatedAt: created,
    },
    opts('sheet_preferences'),
  );

  Team.hasMany(Membership, { foreignKey: 'teamId' });
  Membership.belongsTo(Team, { foreignKey: 'teamId' });
  User.hasMany(Membership, { foreignKey: 'userId' });
  Membership.belongsTo(User, { foreignKey: 'userId' });
  Team.hasMany(Sheet, { foreignKey: 'teamId' });
  Sheet.belongsTo(Team, { foreignKey: 'teamId' });
  Sheet.belongsTo(User, { as: 'creator', foreignKey: 'createdBy' });
  Sheet.belongsTo(User, { as: 'updater', foreignKey: 'updatedBy' });
  Sheet.hasMany(SheetRevision, { foreignKey: 'sheetId' });
  SheetRevision.belongsTo(Sheet, { foreignKey: 'sheetId' });
  SheetRevision.belongsTo(User, { as: 'author', foreignKey: 'authorId' });
  Sheet.hasOne(SheetPreference, { foreignKey: 'sheetId' });
  Sheet.hasMany(Comment, { foreignKey: 'sheetId' });
  Comment.belongsTo(User, { as: 'author', foreignKey: 'authorId' });
}
