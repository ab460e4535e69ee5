import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/** Who in a guild sees the verdicts on other makers' blocks: its officers only (the default) or everyone. */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.addColumn(
      'guilds',
      'verdicts_visible_to',
      { type: DataTypes.STRING(8), allowNull: false, defaultValue: 'officers' },
      { transaction },
    );
    await sequelize.query(
      `ALTER TABLE guilds ADD CONSTRAINT guilds_verdicts_visible_to_check CHECK (verdicts_visible_to IN ('officers', 'guild'))`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.removeColumn('guilds', 'verdicts_visible_to');
};
