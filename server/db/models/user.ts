import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Units } from '@shared/schemas/auth';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare displayName: string;
  declare passwordHash: string;
  declare units: CreationOptional<Units>;
  /** False until the person picks a unit: each guild's default unit applies to them there until then. */
  declare unitsChosen: CreationOptional<boolean>;
  /** Private: shown only to coordinators of swaps the user joined. */
  declare mailingAddress: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        displayName: { type: DataTypes.STRING(80), allowNull: false },
        passwordHash: { type: DataTypes.STRING(255), allowNull: false },
        units: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' },
        unitsChosen: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        mailingAddress: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users', modelName: 'User' },
    );
  }
}
