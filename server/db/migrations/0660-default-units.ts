import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * A guild's default unit for lengths, and whether a person has chosen a unit of their own: until they
 * do, each guild's default applies to them there. Everyone who already picked millimetres chose it.
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.addColumn(
      'guilds',
      'default_unit',
      { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' },
      { transaction },
    );
    await sequelize.query(`ALTER TABLE guilds ADD CONSTRAINT guilds_default_unit_check CHECK (default_unit IN ('in', 'mm'))`, {
      transaction,
    });
    await queryInterface.addColumn(
      'users',
      'units_chosen',
      { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      { transaction },
    );
    await sequelize.query(`UPDATE users SET units_chosen = true WHERE units = 'mm'`, { transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.removeColumn('users', 'units_chosen', { transaction });
    await queryInterface.removeColumn('guilds', 'default_unit', { transaction });
  });
};
