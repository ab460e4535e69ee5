import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { PhotoMime } from '@shared/schemas/photos';
import type { User } from './user';

/** A stored photo of a block or of a chat message (exactly one of the two); files named by us. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<number>;
  declare guildId: number;
  declare blockId: number | null;
  declare chatMessageId: number | null;
  declare uploadedById: number | null;
  declare fileName: string;
  declare thumbFileName: string;
  declare mime: PhotoMime;
  declare width: number;
  declare height: number;
  declare thumbWidth: number;
  declare thumbHeight: number;
  declare bytes: number;
  declare originalBytes: number;
  declare createdAt: CreationOptional<Date>;
  declare uploadedBy?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    Photo.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guildId: { type: DataTypes.INTEGER, allowNull: false },
        blockId: { type: DataTypes.INTEGER, allowNull: true },
        chatMessageId: { type: DataTypes.INTEGER, allowNull: true },
        uploadedById: { type: DataTypes.INTEGER, allowNull: true },
        fileName: { type: DataTypes.STRING(40), allowNull: false },
        thumbFileName: { type: DataTypes.STRING(40), allowNull: false },
        mime: { type: DataTypes.STRING(16), allowNull: false },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        thumbWidth: { type: DataTypes.INTEGER, allowNull: false },
        thumbHeight: { type: DataTypes.INTEGER, allowNull: false },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        originalBytes: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photos', modelName: 'Photo', updatedAt: false },
    );
  }
}
