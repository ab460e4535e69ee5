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
import type { Swap } from './swap';
import type { User } from './user';

export type SignupStatus = 'active' | 'withdrawn';

/** A member's pledge to a swap; one row per (swap, member), kept as 'withdrawn' after withdrawal. */
export class Signup extends Model<InferAttributes<Signup>, InferCreationAttributes<Signup>> {
  declare id: CreationOptional<number>;
  declare swapId: ForeignKey<Swap['id']>;
  declare userId: ForeignKey<User['id']>;
  declare blocks: number;
  declare status: CreationOptional<SignupStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize) {
    Signup.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        blocks: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'signups', modelName: 'Signup' },
    );
  }
}
