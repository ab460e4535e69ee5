import { DataTypes, fn } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * Photo estimates: a block's size worked out from corners marked on one of its photos. Kept apart
 * from `measurements`, whose latest ruler row is the block's verdict: an estimate never decides one.
 * The marked corners are stored so every number can be worked out again.
 */
const inches = (allowNull = false) => ({ type: DataTypes.DECIMAL(8, 4), allowNull });
const signed = () => ({ type: DataTypes.DECIMAL(9, 4), allowNull: false });

export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'photo_estimates',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        block_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'blocks', key: 'id' }, onDelete: 'CASCADE' },
        // A removed photo leaves its estimates behind, without the picture.
        photo_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'photos', key: 'id' }, onDelete: 'SET NULL' },
        measured_by_id: {
          type: DataTypes.INTEGER,
          allowNull: true,
          references: { model: 'users', key: 'id' },
          onDelete: 'SET NULL',
        },
        reference_size: inches(),
        reference_corners: { type: DataTypes.JSONB, allowNull: false },
        block_corners: { type: DataTypes.JSONB, allowNull: false },
        width: inches(),
        height: inches(),
        side_top: inches(),
        side_right: inches(),
        side_bottom: inches(),
        side_left: inches(),
        diagonal1: inches(),
        diagonal2: inches(),
        turned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        verdict: { type: DataTypes.STRING(16), allowNull: false },
        deviation_width: signed(),
        deviation_height: signed(),
        deviation_diagonal: signed(),
        expected_error: inches(),
        borderline: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        reference_pixels: { type: DataTypes.DECIMAL(10, 2), allowNull: false },
        obliqueness: { type: DataTypes.DECIMAL(10, 4), allowNull: false },
        warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: fn('now') },
      },
      { transaction },
    );
    await queryInterface.addIndex('photo_estimates', ['block_id', 'created_at'], { transaction });
    await queryInterface.addIndex('photo_estimates', ['photo_id'], { transaction });
    await queryInterface.sequelize.query(
      `ALTER TABLE photo_estimates ADD CONSTRAINT photo_estimates_verdict_check CHECK (verdict IN ('true','trim','short','skewed'));
       ALTER TABLE photo_estimates ADD CONSTRAINT photo_estimates_lengths_check
         CHECK (reference_size > 0 AND width > 0 AND height > 0 AND diagonal1 > 0 AND diagonal2 > 0 AND expected_error >= 0);
       ALTER TABLE photo_estimates ADD CONSTRAINT photo_estimates_corners_check
         CHECK (jsonb_array_length(reference_corners) = 4 AND jsonb_array_length(block_corners) = 4);`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  await queryInterface.dropTable('photo_estimates');
};
