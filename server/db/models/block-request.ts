import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Block } from './block';

/** A block request sent with a clientId: the first answer is stored and replayed for repeats. */
export class BlockRequest extends Model<InferAttributes<BlockRequest>, InferCreationAttributes<BlockRequest>> {
  declare clientId: string;
  declare userId: number | null;
  declare blockId: ForeignKey<Block['id']>;
  declare action: string;
  declare statusCode: CreationOptional<number | null>;
  declare response: CreationOptional<object | null>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    BlockRequest.init(
      {
        clientId: { type: DataTypes.UUID, primaryKey: true },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(32), allowNull: false },
        statusCode: { type: DataTypes.INTEGER, allowNull: true },
        response: { type: DataTypes.JSONB, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'block_requests', modelName: 'BlockRequest', updatedAt: false },
    );
  }
}
