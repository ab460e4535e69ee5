import type { Migration } from '../migrator';

/**
 * The moment a queued message was written for. Its words are checked again at send time as of the
 * later of that moment and the clock, so "due tomorrow" stays true and a swap that moved on is seen.
 */
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`ALTER TABLE mail_messages ADD COLUMN written_for TIMESTAMPTZ NOT NULL DEFAULT now();`);
};

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`ALTER TABLE mail_messages DROP COLUMN IF EXISTS written_for;`);
};
