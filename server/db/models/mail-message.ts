import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { AnyMailCategory, MailStatus } from '@shared/schemas/notifications';
import type { User } from './user';

/**
 * One e-mail to one person, recorded before it is sent. `idempotencyKey` is UNIQUE: whoever inserts
 * it first owns the message; a second worker, node or restart finds it there and sends nothing.
 */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare idempotencyKey: string;
  declare category: AnyMailCategory;
  /** Which template made it, e.g. `due-reminder`. */
  declare kind: string;
  declare guildId: number | null;
  declare swapId: number | null;
  declare userId: number | null;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string;
  declare status: CreationOptional<MailStatus>;
  declare statusReason: CreationOptional<string | null>;
  declare attempts: CreationOptional<number>;
  /** While a worker is sending, others leave the message alone until this passes. */
  declare lockedUntil: CreationOptional<Date | null>;
  declare providerMessageId: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize) {
    MailMessage.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        idempotencyKey: { type: DataTypes.STRING(200), allowNull: false, unique: true },
        category: { type: DataTypes.STRING(32), allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        guildId: { type: DataTypes.INTEGER, allowNull: true },
        swapId: { type: DataTypes.INTEGER, allowNull: true },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        toAddress: { type: DataTypes.STRING(254), allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false },
        htmlBody: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'queued' },
        statusReason: { type: DataTypes.TEXT, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        lockedUntil: { type: DataTypes.DATE, allowNull: true },
        providerMessageId: { type: DataTypes.STRING(300), allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'mail_messages', modelName: 'MailMessage' },
    );
  }
}
