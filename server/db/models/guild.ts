import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Units } from '@shared/schemas/auth';
import type { VerdictsVisibleTo } from '@shared/schemas/guilds';

export class Guild extends Model<InferAttributes<Guild>, InferCreationAttributes<Guild>> {
  declare id: CreationOptional<number>;
  declare name: string;
  /** IANA zone in which deadlines are shown to members. */
  declare timeZone: CreationOptional<string>;
  /** ISO 4217, lower case; every fee and due of the guild is in it. */
  declare currency: CreationOptional<string>;
  /** Yearly dues in the currency's minor unit, and the membership year they are for (both or neither). */
  declare duesAmount: CreationOptional<number | null>;
  declare duesYear: CreationOptional<number | null>;
  /** What a bare number means to members who have not chosen a unit of their own. */
  declare defaultUnit: CreationOptional<Units>;
  /** Who sees the verdicts on other makers' blocks; makers always see their own. */
  declare verdictsVisibleTo: CreationOptional<VerdictsVisibleTo>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Guild.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(100), allowNull: false },
        timeZone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
        currency: { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'usd' },
        duesAmount: { type: DataTypes.INTEGER, allowNull: true },
        duesYear: { type: DataTypes.INTEGER, allowNull: true },
        defaultUnit: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' },
        verdictsVisibleTo: { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'officers' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'guilds', modelName: 'Guild' },
    );
  }
}
