import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { SwapState } from '@shared/schemas/swaps';
import type { Swap } from './swap';
import type { User } from './user';

/** One move of a swap between states: who asked, when, and why. Creation is recorded with from = null. */
export class SwapTransition extends Model<InferAttributes<SwapTransition>, InferCreationAttributes<SwapTransition>> {
  declare id: CreationOptional<number>;
  declare swapId: Swap['id'];
  declare fromState: SwapState | null;
  declare toState: SwapState;
  declare byId: number | null;
  declare at: CreationOptional<Date>;
  declare reason: CreationOptional<string | null>;
  declare by?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    SwapTransition.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        swapId: { type: DataTypes.INTEGER, allowNull: false },
        fromState: { type: DataTypes.STRING(16), allowNull: true },
        toState: { type: DataTypes.STRING(16), allowNull: false },
        byId: { type: DataTypes.INTEGER, allowNull: true },
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        reason: { type: DataTypes.STRING(500), allowNull: true },
      },
      { sequelize, tableName: 'swap_transitions', modelName: 'SwapTransition', timestamps: false },
    );
  }
}
