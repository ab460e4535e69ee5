import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
};

export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'users',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        display_name: { type: DataTypes.STRING(80), allowNull: false },
        password_hash: { type: DataTypes.STRING(255), allowNull: false },
        units: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' },
        mailing_address: { type: DataTypes.TEXT, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.createTable(
      'guilds',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(100), allowNull: false },
        time_zone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.createTable(
      'memberships',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        role: { type: DataTypes.STRING(16), allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('memberships', ['guild_id', 'user_id'], { unique: true, transaction });
    await queryInterface.addIndex('memberships', ['user_id'], { transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('admin','coordinator','member'));
       ALTER TABLE memberships ADD CONSTRAINT memberships_status_check CHECK (status IN ('active','removed'));
       ALTER TABLE users ADD CONSTRAINT users_units_check CHECK (units IN ('in','mm'));`,
      { transaction },
    );
    await queryInterface.createTable(
      'invitations',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        email: { type: DataTypes.STRING(254), allowNull: false },
        role: { type: DataTypes.STRING(16), allowNull: false },
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        invited_by_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'SET NULL',
        },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        accepted_at: { type: DataTypes.DATE, allowNull: true },
        accepted_by_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'SET NULL',
        },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('invitations', ['guild_id'], { transaction });
    await queryInterface.createTable(
      'password_resets',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        used_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    // The table connect-pg-simple expects (its own table.sql).
    await queryInterface.sequelize.query(
      `CREATE TABLE "session" ("sid" varchar NOT NULL COLLATE "default", "sess" json NOT NULL, "expire" timestamp(6) NOT NULL,
         CONSTRAINT "session_pkey" PRIMARY KEY ("sid") NOT DEFERRABLE INITIALLY IMMEDIATE) WITH (OIDS=FALSE);
       CREATE INDEX "IDX_session_expire" ON "session" ("expire");`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  for (const table of ['session', 'password_resets', 'invitations', 'memberships', 'guilds', 'users']) {
    await queryInterface.dropTable(table);
  }
};
