import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { MailCategory } from '@shared/schemas/notifications';

/** A person's choice for one kind of e-mail; no row means the default, which is on. */
export class MailPreference extends Model<InferAttributes<MailPreference>, InferCreationAttributes<MailPreference>> {
  declare userId: number;
  declare category: MailCategory;
  declare enabled: boolean;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    MailPreference.init(
      {
        userId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
        category: { type: DataTypes.STRING(32), allowNull: false, primaryKey: true },
        enabled: { type: DataTypes.BOOLEAN, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'mail_preferences', modelName: 'MailPreference' },
    );
  }
}
