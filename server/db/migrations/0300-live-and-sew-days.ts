import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
};

export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    // The table @socket.io/postgres-adapter keeps payloads in that are too large for NOTIFY.
    await queryInterface.sequelize.query(
      `CREATE TABLE socket_io_attachments (
         id bigserial UNIQUE,
         created_at timestamptz DEFAULT NOW(),
         payload bytea
       );`,
      { transaction },
    );
    await queryInterface.createTable(
      'sew_days',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        title: { type: DataTypes.STRING(120), allowNull: false },
        starts_at: { type: DataTypes.DATE, allowNull: false },
        ends_at: { type: DataTypes.DATE, allowNull: false },
        place: { type: DataTypes.STRING(300), allowNull: true },
        video_url: { type: DataTypes.STRING(500), allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        cancelled_at: { type: DataTypes.DATE, allowNull: true },
        created_by_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'SET NULL',
        },
        // Bumped on every change, so calendar programs replace their copy (iCalendar SEQUENCE).
        revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('sew_days', ['guild_id', 'starts_at'], { transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE sew_days ADD CONSTRAINT sew_days_times_check CHECK (ends_at > starts_at);
       ALTER TABLE sew_days ADD CONSTRAINT sew_days_where_check CHECK (place IS NOT NULL OR video_url IS NOT NULL);`,
      { transaction },
    );
    await queryInterface.createTable(
      'rsvps',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        sew_day_id: {
          type: DataTypes.INTEGER,
          allowNull: false,
          references: { model: 'sew_days', key: 'id' },
          onDelete: 'CASCADE',
        },
        user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        answer: { type: DataTypes.STRING(8), allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('rsvps', ['sew_day_id', 'user_id'], { unique: true, transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE rsvps ADD CONSTRAINT rsvps_answer_check CHECK (answer IN ('going','maybe','no'));`,
      {
        transaction,
      },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  for (const table of ['rsvps', 'sew_days', 'socket_io_attachments']) await queryInterface.dropTable(table);
};
