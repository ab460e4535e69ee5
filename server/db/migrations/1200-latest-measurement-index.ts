import type { Migration } from '../migrator';

/**
 * A block's latest ruler or maker measurement is read as the first entry of this index, newest time
 * then highest id, so a block answer costs the same after its hundredth measurement as after its
 * first. It replaces the index without `id`, which left the tie-break to a sort of the whole history.
 */
export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.addIndex('measurements', ['block_id', 'source', 'created_at', 'id'], { transaction });
    await queryInterface.removeIndex('measurements', ['block_id', 'source', 'created_at'], { transaction });
  });
};

export const down: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.addIndex('measurements', ['block_id', 'source', 'created_at'], { transaction });
    await queryInterface.removeIndex('measurements', ['block_id', 'source', 'created_at', 'id'], { transaction });
  });
};
