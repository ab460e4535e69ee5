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
import type { BlockSpec } from '@shared/schemas/blocks';
import type { SwapMode, SwapState } from '@shared/schemas/swaps';
import type { Guild } from './guild';
import type { User } from './user';

/** A NUMERIC column of inches: PostgreSQL sends strings, the model gives numbers. */
export function inchesColumn(name: string, allowNull = false) {
  return {
    type: DataTypes.DECIMAL(8, 4),
    allowNull,
    get(this: Model) {
      const raw = this.getDataValue(name) as string | number | null;
      return raw === null || raw === undefined ? raw : Number(raw);
    },
  };
}

export class Swap extends Model<InferAttributes<Swap>, InferCreationAttributes<Swap>> {
  declare id: CreationOptional<number>;
  declare guildId: ForeignKey<Guild['id']>;
  declare title: string;
  declare description: CreationOptional<string>;
  declare blockSpec: BlockSpec;
  declare seam: number;
  declare unfinishedWidth: number;
  declare unfinishedHeight: number;
  declare finishedWidth: number;
  declare finishedHeight: number;
  declare tolerance: number;
  declare squareness: number;
  declare colourRules: CreationOptional<{ role: string; note: string }[]>;
  declare quotaMin: number;
  declare quotaMax: number;
  declare signupClosesAt: Date;
  declare dueAt: Date;
  /** read by the reminder mail: days before sign-up closes / blocks are due */
  declare signupReminderDays: CreationOptional<number>;
  declare dueReminderDays: CreationOptional<number>;
  declare mode: CreationOptional<SwapMode>;
  /** Fees in the guild currency's minor unit; 0 is no fee. Return postage is asked only of makers who post blocks. */
  declare entryFee: CreationOptional<number>;
  declare postageFee: CreationOptional<number>;
  declare giftRecipientId: CreationOptional<number | null>;
  declare giftRecipientName: CreationOptional<string | null>;
  declare state: CreationOptional<SwapState>;
  declare createdById: number | null;
  declare distributionConfirmedAt: CreationOptional<Date | null>;
  declare distributionConfirmedById: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare guild?: NonAttribute<Guild>;
  declare createdBy?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    Swap.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        title: { type: DataTypes.STRING(120), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        blockSpec: { type: DataTypes.JSONB, allowNull: false },
        seam: inchesColumn('seam'),
        unfinishedWidth: inchesColumn('unfinishedWidth'),
        unfinishedHeight: inchesColumn('unfinishedHeight'),
        finishedWidth: inchesColumn('finishedWidth'),
        finishedHeight: inchesColumn('finishedHeight'),
        tolerance: inchesColumn('tolerance'),
        squareness: inchesColumn('squareness'),
        colourRules: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        quotaMin: { type: DataTypes.INTEGER, allowNull: false },
        quotaMax: { type: DataTypes.INTEGER, allowNull: false },
        signupClosesAt: { type: DataTypes.DATE, allowNull: false },
        dueAt: { type: DataTypes.DATE, allowNull: false },
        signupReminderDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 7 },
        dueReminderDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 2 },
        mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'return' },
        entryFee: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        postageFee: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        giftRecipientId: { type: DataTypes.INTEGER, allowNull: true },
        giftRecipientName: { type: DataTypes.STRING(120), allowNull: true },
        state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'draft' },
        createdById: { type: DataTypes.INTEGER, allowNull: true },
        distributionConfirmedAt: { type: DataTypes.DATE, allowNull: true },
        distributionConfirmedById: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'swaps', modelName: 'Swap' },
    );
  }
}
