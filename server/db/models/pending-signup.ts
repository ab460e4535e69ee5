import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/**
 * A sign-up waiting for its address to be confirmed; it becomes a user only through the link mailed
 * to that address. Holds the password's hash, never the password, and only the SHA-256 of the token.
 */
export class PendingSignup extends Model<InferAttributes<PendingSignup>, InferCreationAttributes<PendingSignup>> {
  declare id: CreationOptional<number>;
  /** Normalised (NFKC, trimmed, lower case), as users.email. */
  declare email: string;
  declare displayName: string;
  declare passwordHash: string;
  /** A same-site path to continue to once confirmed (an invitation, say). */
  declare nextPath: string | null;
  /** Set by the job that mails the link; null until then. */
  declare tokenHash: CreationOptional<string | null>;
  declare expiresAt: Date;
  declare mailedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PendingSignup.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        displayName: { type: DataTypes.STRING(80), allowNull: false },
        passwordHash: { type: DataTypes.STRING(255), allowNull: false },
        nextPath: { type: DataTypes.STRING(500), allowNull: true },
        tokenHash: { type: DataTypes.STRING(64), allowNull: true, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        mailedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'pending_signups', modelName: 'PendingSignup' },
    );
  }
}
