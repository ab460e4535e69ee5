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
import type { BlockState } from '@shared/schemas/swaps';
import type { VerdictName } from '@shared/swap-types';
import type { Swap } from './swap';
import type { User } from './user';

export type HandInHow = 'in-person' | 'post';

/** One pledged block of a swap, numbered per maker, moving pledged → … → returned. */
export class Block extends Model<InferAttributes<Block>, InferCreationAttributes<Block>> {
  declare id: CreationOptional<number>;
  declare swapId: ForeignKey<Swap['id']>;
  declare makerId: ForeignKey<User['id']>;
  declare sequence: number;
  declare state: CreationOptional<BlockState>;
  declare handInHow: CreationOptional<HandInHow | null>;
  declare handInNote: CreationOptional<string | null>;
  declare trimmed: CreationOptional<boolean>;
  declare trimmedAt: CreationOptional<Date | null>;
  /** verdict of the latest ruler measurement */
  declare verdict: CreationOptional<VerdictName | null>;
  declare recipientId: CreationOptional<number | null>;
  declare receivedById: CreationOptional<number | null>;
  declare sewnAt: CreationOptional<Date | null>;
  declare handedInAt: CreationOptional<Date | null>;
  declare receivedAt: CreationOptional<Date | null>;
  declare measuredAt: CreationOptional<Date | null>;
  declare returnedAt: CreationOptional<Date | null>;
  /** set when an officer accepted an off-size block anyway, with the reason */
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedById: CreationOptional<number | null>;
  declare acceptedReason: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare swap?: NonAttribute<Swap>;
  declare maker?: NonAttribute<User>;
  declare recipient?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    Block.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        sequence: { type: DataTypes.INTEGER, allowNull: false },
        state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pledged' },
        handInHow: { type: DataTypes.STRING(16), allowNull: true },
        handInNote: { type: DataTypes.STRING(500), allowNull: true },
        trimmed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        trimmedAt: { type: DataTypes.DATE, allowNull: true },
        verdict: { type: DataTypes.STRING(16), allowNull: true },
        recipientId: { type: DataTypes.INTEGER, allowNull: true },
        receivedById: { type: DataTypes.INTEGER, allowNull: true },
        sewnAt: { type: DataTypes.DATE, allowNull: true },
        handedInAt: { type: DataTypes.DATE, allowNull: true },
        receivedAt: { type: DataTypes.DATE, allowNull: true },
        measuredAt: { type: DataTypes.DATE, allowNull: true },
        returnedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedById: { type: DataTypes.INTEGER, allowNull: true },
        acceptedReason: { type: DataTypes.STRING(500), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'blocks', modelName: 'Block' },
    );
  }
}
