import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { Quad, Verdict } from '@shared/quilt';
import type { User } from './user';
import { inchesColumn } from './swap';

function decimal(name: string, precision: number, scale: number) {
  return { ...inchesColumn(name), type: DataTypes.DECIMAL(precision, scale) };
}

/** A block's size estimated from corners marked on its photo; never the block's verdict. */
export class PhotoEstimate extends Model<InferAttributes<PhotoEstimate>, InferCreationAttributes<PhotoEstimate>> {
  declare id: CreationOptional<number>;
  declare blockId: number;
  declare photoId: number | null;
  declare measuredById: number | null;
  declare referenceSize: number;
  declare referenceCorners: Quad;
  declare blockCorners: Quad;
  declare width: number;
  declare height: number;
  declare sideTop: number;
  declare sideRight: number;
  declare sideBottom: number;
  declare sideLeft: number;
  declare diagonal1: number;
  declare diagonal2: number;
  declare turned: boolean;
  declare verdict: Verdict;
  declare deviationWidth: number;
  declare deviationHeight: number;
  declare deviationDiagonal: number;
  declare expectedError: number;
  declare borderline: boolean;
  declare referencePixels: number;
  declare obliqueness: number;
  declare warnings: string[];
  declare createdAt: CreationOptional<Date>;
  declare measuredBy?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    PhotoEstimate.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        blockId: { type: DataTypes.INTEGER, allowNull: false },
        photoId: { type: DataTypes.INTEGER, allowNull: true },
        measuredById: { type: DataTypes.INTEGER, allowNull: true },
        referenceSize: inchesColumn('referenceSize'),
        referenceCorners: { type: DataTypes.JSONB, allowNull: false },
        blockCorners: { type: DataTypes.JSONB, allowNull: false },
        width: inchesColumn('width'),
        height: inchesColumn('height'),
        sideTop: inchesColumn('sideTop'),
        sideRight: inchesColumn('sideRight'),
        sideBottom: inchesColumn('sideBottom'),
        sideLeft: inchesColumn('sideLeft'),
        diagonal1: inchesColumn('diagonal1'),
        diagonal2: inchesColumn('diagonal2'),
        turned: { type: DataTypes.BOOLEAN, allowNull: false },
        verdict: { type: DataTypes.STRING(16), allowNull: false },
        deviationWidth: decimal('deviationWidth', 9, 4),
        deviationHeight: decimal('deviationHeight', 9, 4),
        deviationDiagonal: decimal('deviationDiagonal', 9, 4),
        expectedError: inchesColumn('expectedError'),
        borderline: { type: DataTypes.BOOLEAN, allowNull: false },
        referencePixels: decimal('referencePixels', 10, 2),
        obliqueness: decimal('obliqueness', 10, 4),
        warnings: { type: DataTypes.JSONB, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photo_estimates', modelName: 'PhotoEstimate', updatedAt: false },
    );
  }
}
