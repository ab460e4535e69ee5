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
import type { ChatRoom } from './chat-room';
import type { User } from './user';

/**
 * A chat line. Deleting is soft: `deletedById` names who took it down (its author, or a moderator)
 * and the text is cleared, so the conversation keeps its shape.
 */
export class ChatMessage extends Model<InferAttributes<ChatMessage>, InferCreationAttributes<ChatMessage>> {
  declare id: CreationOptional<number>;
  declare roomId: ForeignKey<ChatRoom['id']>;
  declare authorId: ForeignKey<User['id']>;
  declare body: string;
  declare editedAt: CreationOptional<Date | null>;
  declare deletedAt: CreationOptional<Date | null>;
  declare deletedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare author?: NonAttribute<User>;

  static initModel(sequelize: Sequelize) {
    ChatMessage.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        roomId: { type: DataTypes.INTEGER, allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        editedAt: { type: DataTypes.DATE, allowNull: true },
        deletedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'chat_messages', modelName: 'ChatMessage' },
    );
  }
}
