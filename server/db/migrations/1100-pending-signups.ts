import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Sign-ups waiting for their address to be confirmed. No account exists until the link in the mail
 * is opened, so nobody can hold an address they cannot read. Only hashes are stored: the password's
 * (argon2id) and the link token's (SHA-256); the token hash is set when the mail goes out.
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'pending_signups',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        display_name: { type: DataTypes.STRING(80), allowNull: false },
        password_hash: { type: DataTypes.STRING(255), allowNull: false },
        next_path: { type: DataTypes.STRING(500), allowNull: true },
        token_hash: { type: DataTypes.STRING(64), allowNull: true, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        mailed_at: { type: DataTypes.DATE, allowNull: true },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { transaction },
    );
    await queryInterface.addIndex('pending_signups', ['email'], { transaction });
    await queryInterface.addIndex('pending_signups', ['expires_at'], { transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.dropTable('pending_signups');
};
