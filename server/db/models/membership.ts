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
import type { User } from './user';
import type { Guild } from './guild';

export type MembershipStatus = 'active' | 'removed';

export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<User['id']>;
  declare guildId: ForeignKey<Guild['id']>;
  declare role: Role;
  declare status: CreationOptional<MembershipStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;
  declare guild?: NonAttribute<Guild>;

  static initModel(sequelize: Sequelize) {
    Membership.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        role: { type: DataTypes.STRING(16), allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'memberships', modelName: 'Membership' },
    );
  }
}
