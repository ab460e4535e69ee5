import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * When each person last looked at each chat room, so the home screen can say which rooms have
 * messages since. A room never opened counts from the day the person joined the guild.
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'chat_reads',
      {
        room_id: {
          type: DataTypes.INTEGER,
          primaryKey: true,
          references: { model: 'chat_rooms', key: 'id' },
          onDelete: 'CASCADE',
        },
        user_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        read_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await queryInterface.addIndex('chat_reads', ['user_id'], { transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.dropTable('chat_reads');
};
