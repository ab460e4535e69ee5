import { DataTypes, fn } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Payments: the guild's currency and yearly dues, a swap's entry and return-postage fees, every
 * payment asked of a member, and each webhook event id seen (so a repeated event changes nothing).
 * Amounts are integers in the currency's minor unit (cents for usd).
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.addColumn(
      'guilds',
      'currency',
      { type: DataTypes.STRING(3), allowNull: false, defaultValue: 'usd' },
      { transaction },
    );
    await queryInterface.addColumn('guilds', 'dues_amount', { type: DataTypes.INTEGER, allowNull: true }, { transaction });
    await queryInterface.addColumn('guilds', 'dues_year', { type: DataTypes.INTEGER, allowNull: true }, { transaction });
    await queryInterface.addColumn(
      'swaps',
      'entry_fee',
      { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      { transaction },
    );
    await queryInterface.addColumn(
      'swaps',
      'postage_fee',
      { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      { transaction },
    );

    await queryInterface.createTable(
      'payments',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        swap_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'swaps', key: 'id' }, onDelete: 'SET NULL' },
        kind: { type: DataTypes.STRING(16), allowNull: false },
        dues_year: { type: DataTypes.INTEGER, allowNull: true },
        amount: { type: DataTypes.INTEGER, allowNull: false },
        currency: { type: DataTypes.STRING(3), allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pending' },
        status_reason: { type: DataTypes.STRING(300), allowNull: true },
        checkout_session_id: { type: DataTypes.STRING(255), allowNull: true },
        payment_intent_id: { type: DataTypes.STRING(255), allowNull: true },
        refund_id: { type: DataTypes.STRING(255), allowNull: true },
        refund_requested_at: { type: DataTypes.DATE, allowNull: true },
        refund_error: { type: DataTypes.STRING(300), allowNull: true },
        paid_at: { type: DataTypes.DATE, allowNull: true },
        refunded_at: { type: DataTypes.DATE, allowNull: true },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: fn('now') },
        updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: fn('now') },
      },
      { transaction },
    );
    await queryInterface.sequelize.query(
      `ALTER TABLE payments ADD CONSTRAINT payments_kind_check CHECK (kind IN ('dues','entry','postage'));
       ALTER TABLE payments ADD CONSTRAINT payments_status_check CHECK (status IN ('pending','paid','refunded','failed'));
       ALTER TABLE payments ADD CONSTRAINT payments_amount_check CHECK (amount > 0);
       ALTER TABLE guilds ADD CONSTRAINT guilds_dues_check CHECK ((dues_amount IS NULL) = (dues_year IS NULL));
       ALTER TABLE swaps ADD CONSTRAINT swaps_fees_check CHECK (entry_fee >= 0 AND postage_fee >= 0);`,
      { transaction },
    );
    await queryInterface.addIndex('payments', ['guild_id', 'created_at'], { transaction });
    await queryInterface.addIndex('payments', ['user_id'], { transaction });
    await queryInterface.addIndex('payments', ['swap_id'], { transaction });
    await queryInterface.addIndex('payments', ['checkout_session_id'], { transaction });
    await queryInterface.addIndex('payments', ['payment_intent_id'], { transaction });

    await queryInterface.createTable(
      'payment_events',
      {
        event_id: { type: DataTypes.STRING(255), primaryKey: true },
        type: { type: DataTypes.STRING(100), allowNull: false },
        received_at: { type: DataTypes.DATE, allowNull: false, defaultValue: fn('now') },
      },
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.dropTable('payment_events', { transaction });
    await queryInterface.dropTable('payments', { transaction });
    await queryInterface.sequelize.query(
      'ALTER TABLE swaps DROP CONSTRAINT IF EXISTS swaps_fees_check; ALTER TABLE guilds DROP CONSTRAINT IF EXISTS guilds_dues_check;',
      { transaction },
    );
    for (const column of ['entry_fee', 'postage_fee']) await queryInterface.removeColumn('swaps', column, { transaction });
    for (const column of ['currency', 'dues_amount', 'dues_year'])
      await queryInterface.removeColumn('guilds', column, { transaction });
  });
};
