import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { Role } from '@shared/schemas/guilds';
import type { Guild } from './guild';
import type { User } from './user';

/** The token itself is only ever in the e-mail; the table keeps its SHA-256. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<number>;
  declare guildId: ForeignKey<Guild['id']>;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  /** Anyone signed in may accept an open invitation; others only from the account with its address. */
  declare open: CreationOptional<boolean>;
  declare invitedById: ForeignKey<User['id']> | null;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedById: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare guild?: NonAttribute<Guild>;

  static initModel(sequelize: Sequelize) {
    Invitation.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        role: { type: DataTypes.STRING(16), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        open: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedById: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invitations', modelName: 'Invitation' },
    );
  }
}
