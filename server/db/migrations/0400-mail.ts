import { DataTypes, fn } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Mail: every message we mean to send (its idempotency key is UNIQUE, so two workers or a restart
 * can never record, and so never send, the same message twice) and per-person preferences. The
 * job queue itself lives in pg-boss's own `pgboss` schema, which pg-boss creates and migrates on start.
 */
// A database-side default, so rows inserted with plain SQL (the outbox) get their timestamps too.
const timestamp = { type: DataTypes.DATE, allowNull: false, defaultValue: fn('now') };

export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'mail_messages',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        idempotency_key: { type: DataTypes.STRING(200), allowNull: false, unique: true },
        category: { type: DataTypes.STRING(32), allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        guild_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        swap_id: { type: DataTypes.INTEGER, allowNull: true },
        user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
        to_address: { type: DataTypes.STRING(254), allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        text_body: { type: DataTypes.TEXT, allowNull: false },
        html_body: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'queued' },
        status_reason: { type: DataTypes.TEXT, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        locked_until: { type: DataTypes.DATE, allowNull: true },
        provider_message_id: { type: DataTypes.STRING(300), allowNull: true },
        sent_at: { type: DataTypes.DATE, allowNull: true },
        created_at: timestamp,
        updated_at: timestamp,
      },
      { transaction },
    );
    await queryInterface.addIndex('mail_messages', ['guild_id', 'created_at'], { transaction });
    await queryInterface.addIndex('mail_messages', ['status', 'updated_at'], { transaction });
    await queryInterface.addIndex('mail_messages', ['user_id'], { transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE mail_messages ADD CONSTRAINT mail_messages_status_check
         CHECK (status IN ('queued','sending','sent','failed','skipped'));`,
      { transaction },
    );

    await queryInterface.createTable(
      'mail_preferences',
      {
        user_id: {
          type: DataTypes.INTEGER,
          allowNull: false,
          primaryKey: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'CASCADE',
        },
        category: { type: DataTypes.STRING(32), allowNull: false, primaryKey: true },
        enabled: { type: DataTypes.BOOLEAN, allowNull: false },
        created_at: timestamp,
        updated_at: timestamp,
      },
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  for (const table of ['mail_preferences', 'mail_messages']) await queryInterface.dropTable(table);
};
