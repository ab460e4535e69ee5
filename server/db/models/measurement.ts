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
import type { MeasurementSource, VerdictName } from '@shared/swap-types';
import type { Block } from './block';
import type { User } from './user';
import { inchesColumn } from './swap';

function signedInches(name: string, allowNull = false) {
  return { ...inchesColumn(name, allowNull), type: DataTypes.DECIMAL(9, 4) };
}

/** A measured size of a block; every measurement is kept, the latest ruler one is the block's verdict. */
export class Measurement extends Model<InferAttributes<Measurement>, InferCreationAttributes<Measurement>> {
  declare id: CreationOptional<number>;
  declare blockId: ForeignKey<Block['id']>;
  declare measuredById: number | null;
  declare source: MeasurementSource;
  declare width: number;
  declare height: number;
  declare diagonal1: CreationOptional<number | null>;
  declare diagonal2: CreationOptional<number | null>;
  declare verdict: VerdictName;
  declare deviationWidth: number;
  declare deviationHeight: number;
  declare deviationDiagonal: CreationOptional<number | null>;
  declare note: CreationOptional<string | null>;
  /** set when the measurement was undone; it stays in the history */
  declare withdrawnAt: CreationOptional<Date | null>;
  declare withdrawnById: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare measuredBy?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    Measurement.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        measuredById: { type: DataTypes.INTEGER, allowNull: true },
        source: { type: DataTypes.STRING(16), allowNull: false },
        width: inchesColumn('width'),
        height: inchesColumn('height'),
        diagonal1: inchesColumn('diagonal1', true),
        diagonal2: inchesColumn('diagonal2', true),
        verdict: { type: DataTypes.STRING(16), allowNull: false },
        deviationWidth: signedInches('deviationWidth'),
        deviationHeight: signedInches('deviationHeight'),
        deviationDiagonal: signedInches('deviationDiagonal', true),
        note: { type: DataTypes.STRING(500), allowNull: true },
        withdrawnAt: { type: DataTypes.DATE, allowNull: true },
        withdrawnById: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'measurements', modelName: 'Measurement' },
    );
  }
}
