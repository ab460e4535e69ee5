import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * One row per chat edit, kept only for the length of the rate-limit window: edits are limited like
 * new messages, counted in PostgreSQL so the limit holds across app nodes.
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'chat_edits',
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        author_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        message_id: {
          type: DataTypes.INTEGER,
          allowNull: false,
          references: { model: 'chat_messages', key: 'id' },
          onDelete: 'CASCADE',
        },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: sequelize.fn('now') },
      },
      { transaction },
    );
    await queryInterface.addIndex('chat_edits', ['author_id', 'created_at'], { name: 'chat_edits_author_created', transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.dropTable('chat_edits');
};
