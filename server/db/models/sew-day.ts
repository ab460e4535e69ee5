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
import type { Guild } from './guild';
import type { User } from './user';
import type { Rsvp } from './rsvp';

/** A gathering to sew together, in a room, on a video call, or both. */
export class SewDay extends Model<InferAttributes<SewDay>, InferCreationAttributes<SewDay>> {
  declare id: CreationOptional<number>;
  declare guildId: ForeignKey<Guild['id']>;
  declare title: string;
  declare startsAt: Date;
  declare endsAt: Date;
  declare place: string | null;
  declare videoUrl: string | null;
  declare notes: string | null;
  declare cancelledAt: CreationOptional<Date | null>;
  declare createdById: ForeignKey<User['id']> | null;
  /** Counts changes, for the iCalendar SEQUENCE. */
  declare revision: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare createdBy?: NonAttribute<User | null>;
  declare guild?: NonAttribute<Guild>;
  declare rsvps?: NonAttribute<Rsvp[]>;

  static initModel(sequelize: Sequelize) {
    SewDay.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        title: { type: DataTypes.STRING(120), allowNull: false },
        startsAt: { type: DataTypes.DATE, allowNull: false },
        endsAt: { type: DataTypes.DATE, allowNull: false },
        place: { type: DataTypes.STRING(300), allowNull: true },
        videoUrl: { type: DataTypes.STRING(500), allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        cancelledAt: { type: DataTypes.DATE, allowNull: true },
        revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sew_days', modelName: 'SewDay' },
    );
  }
}
