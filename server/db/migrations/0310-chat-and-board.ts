import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
};

export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'chat_rooms',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        kind: { type: DataTypes.STRING(8), allowNull: false },
        sew_day_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          unique: true,
          references: { model: 'sew_days', key: 'id' },
          onDelete: 'CASCADE',
        },
        swap_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          unique: true,
          references: { model: 'swaps', key: 'id' },
          onDelete: 'CASCADE',
        },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.sequelize.query(
      `ALTER TABLE chat_rooms ADD CONSTRAINT chat_rooms_owner_check CHECK (
         (kind = 'sewday' AND sew_day_id IS NOT NULL AND swap_id IS NULL) OR
         (kind = 'swap' AND swap_id IS NOT NULL AND sew_day_id IS NULL));`,
      { transaction },
    );
    await queryInterface.createTable(
      'chat_messages',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        room_id: {
          type: DataTypes.INTEGER,
          allowNull: false,
          references: { model: 'chat_rooms', key: 'id' },
          onDelete: 'CASCADE',
        },
        author_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        body: { type: DataTypes.TEXT, allowNull: false },
        edited_at: { type: DataTypes.DATE, allowNull: true },
        deleted_at: { type: DataTypes.DATE, allowNull: true },
        deleted_by_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'SET NULL',
        },
        ...timestamps,
      },
      { transaction },
    );
    // History pages walk a room by id, newest first; the rate limit counts one author's recent lines.
    await queryInterface.addIndex('chat_messages', ['room_id', 'id'], { transaction });
    await queryInterface.addIndex('chat_messages', ['author_id', 'created_at'], { transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE chat_messages ADD CONSTRAINT chat_messages_body_check CHECK (char_length(body) <= 2000);`,
      {
        transaction,
      },
    );

    // One counter per swap, shared by every app node: board changes are numbered from it.
    await queryInterface.createTable(
      'swap_versions',
      {
        swap_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'swaps', key: 'id' }, onDelete: 'CASCADE' },
        version: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
      },
      { transaction },
    );
    await queryInterface.createTable(
      'swap_activities',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        swap_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'swaps', key: 'id' }, onDelete: 'CASCADE' },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        actor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
        subject_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
        block_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'blocks', key: 'id' }, onDelete: 'SET NULL' },
        detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { transaction },
    );
    await queryInterface.addIndex('swap_activities', ['swap_id', 'id'], { transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  for (const table of ['swap_activities', 'swap_versions', 'chat_messages', 'chat_rooms']) await queryInterface.dropTable(table);
};
