import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** What happened on a swap, kept from its domain events for the board's recent-activity list. */
export class Activity extends Model<InferAttributes<Activity>, InferCreationAttributes<Activity>> {
  declare id: CreationOptional<number>;
  declare guildId: number;
  declare swapId: number;
  declare kind: string;
  declare actorId: number | null;
  declare subjectId: number | null;
  declare blockId: number | null;
  declare detail: Record<string, string | number | boolean | null>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Activity.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guildId: { type: DataTypes.INTEGER, allowNull: false },
        swapId: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        actorId: { type: DataTypes.INTEGER, allowNull: true },
        subjectId: { type: DataTypes.INTEGER, allowNull: true },
        blockId: { type: DataTypes.INTEGER, allowNull: true },
        detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'swap_activities', modelName: 'Activity', updatedAt: false },
    );
  }
}
