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
import type { RsvpAnswer } from '@shared/schemas/sewdays';
import type { SewDay } from './sew-day';
import type { User } from './user';

/** One person's answer to one sew day; answering again replaces it. */
export class Rsvp extends Model<InferAttributes<Rsvp>, InferCreationAttributes<Rsvp>> {
  declare id: CreationOptional<number>;
  declare sewDayId: ForeignKey<SewDay['id']>;
  declare userId: ForeignKey<User['id']>;
  declare answer: RsvpAnswer;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize) {
    Rsvp.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        answer: { type: DataTypes.STRING(8), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'rsvps', modelName: 'Rsvp' },
    );
  }
}
