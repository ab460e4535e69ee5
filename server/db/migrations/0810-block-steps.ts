import type { Migration } from '../migrator';

/**
 * Small steps that can be undone, and blocks accepted by decision.
 * - `block_steps`: each step taken on a block (sewn, handed in, received, measured, trimmed,
 *   accepted) with who took it and the block's columns just before, so *Undo* puts them back.
 * - `measurements.withdrawn_*`: an undone measurement stays in the history, marked withdrawn.
 * - `blocks.accepted_*`: an officer accepted an off-size block anyway, and why.
 */
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(
      `CREATE TABLE block_steps (
         id SERIAL PRIMARY KEY,
         block_id INTEGER NOT NULL REFERENCES blocks(id) ON DELETE CASCADE,
         action VARCHAR(24) NOT NULL,
         by_id INTEGER REFERENCES users(id) ON DELETE SET NULL,
         at TIMESTAMPTZ NOT NULL DEFAULT now(),
         before JSONB NOT NULL,
         measurement_id INTEGER REFERENCES measurements(id) ON DELETE SET NULL,
         undone_at TIMESTAMPTZ,
         undone_by_id INTEGER REFERENCES users(id) ON DELETE SET NULL,
         CONSTRAINT block_steps_action_check CHECK (action IN ('sewn','handed_in','received','measured','trimmed','accepted'))
       );
       CREATE INDEX block_steps_block_idx ON block_steps (block_id, id);
       ALTER TABLE measurements ADD COLUMN withdrawn_at TIMESTAMPTZ,
         ADD COLUMN withdrawn_by_id INTEGER REFERENCES users(id) ON DELETE SET NULL;
       ALTER TABLE blocks ADD COLUMN accepted_at TIMESTAMPTZ,
         ADD COLUMN accepted_by_id INTEGER REFERENCES users(id) ON DELETE SET NULL,
         ADD COLUMN accepted_reason VARCHAR(500);
       ALTER TABLE blocks ADD CONSTRAINT blocks_accepted_reason_check CHECK (accepted_at IS NULL OR accepted_reason IS NOT NULL);`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(
    `ALTER TABLE blocks DROP CONSTRAINT IF EXISTS blocks_accepted_reason_check;
     ALTER TABLE blocks DROP COLUMN IF EXISTS accepted_reason, DROP COLUMN IF EXISTS accepted_by_id, DROP COLUMN IF EXISTS accepted_at;
     ALTER TABLE measurements DROP COLUMN IF EXISTS withdrawn_by_id, DROP COLUMN IF EXISTS withdrawn_at;
     DROP TABLE IF EXISTS block_steps;`,
  );
};
