import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Invitations are bound to the address they were sent to; an admin may mark one open (anyone with
 * the link may accept it). Indexes for the daily counts per inviter and per guild, and for finding a
 * pending invitation to the same address.
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.addColumn(
      'invitations',
      'open',
      { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      { transaction },
    );
    await queryInterface.addIndex('invitations', ['invited_by_id', 'created_at'], {
      name: 'invitations_inviter_created',
      transaction,
    });
    await queryInterface.addIndex('invitations', ['guild_id', 'created_at'], { name: 'invitations_guild_created', transaction });
    await queryInterface.addIndex('invitations', ['guild_id', 'email'], { name: 'invitations_guild_email', transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    for (const name of ['invitations_guild_email', 'invitations_guild_created', 'invitations_inviter_created']) {
      await queryInterface.removeIndex('invitations', name, { transaction });
    }
    await queryInterface.removeColumn('invitations', 'open', { transaction });
  });
};
