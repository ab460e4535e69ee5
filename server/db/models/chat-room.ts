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
import type { ChatRoomKind } from '@shared/schemas/chat';
import type { Guild } from './guild';
import type { SewDay } from './sew-day';

/** A conversation: one per sew day, one per swap (exactly one of the two is set). */
export class ChatRoom extends Model<InferAttributes<ChatRoom>, InferCreationAttributes<ChatRoom>> {
  declare id: CreationOptional<number>;
  declare guildId: ForeignKey<Guild['id']>;
  declare kind: ChatRoomKind;
  declare sewDayId: ForeignKey<SewDay['id']> | null;
  declare swapId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare sewDay?: NonAttribute<SewDay | null>;

  static initModel(sequelize: Sequelize) {
    ChatRoom.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        kind: { type: DataTypes.STRING(8), allowNull: false },
        swapId: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'chat_rooms', modelName: 'ChatRoom' },
    );
  }
}
