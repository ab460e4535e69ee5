import type { Migration } from '../migrator';

/**
 * The design wall: one layout per member and swap (the grid, the setting and each cell's block,
 * turn and pin), and the colour statistics of each photo (mean L*a*b* and lightness percentiles),
 * filled in when a photo is stored and, for earlier photos, by a background pass.
 */
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(
      `CREATE TABLE designs (
         id SERIAL PRIMARY KEY,
         swap_id INTEGER NOT NULL REFERENCES swaps(id) ON DELETE CASCADE,
         user_id INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
         columns SMALLINT NOT NULL CHECK (columns BETWEEN 1 AND 30),
         rows SMALLINT NOT NULL CHECK (rows BETWEEN 1 AND 30),
         sashing NUMERIC(8,4),
         cornerstones BOOLEAN,
         borders JSONB,
         alternate BOOLEAN,
         cells JSONB NOT NULL,
         created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
         updated_at TIMESTAMPTZ NOT NULL DEFAULT now(),
         UNIQUE (swap_id, user_id)
       )`,
      { transaction },
    );
    await sequelize.query('CREATE INDEX designs_user_id ON designs (user_id)', { transaction });
    await sequelize.query(
      `CREATE TABLE photo_colours (
         photo_id INTEGER PRIMARY KEY REFERENCES photos(id) ON DELETE CASCADE,
         mean_l NUMERIC(6,2) NOT NULL,
         mean_a NUMERIC(6,2) NOT NULL,
         mean_b NUMERIC(6,2) NOT NULL,
         p10 NUMERIC(6,2) NOT NULL,
         p50 NUMERIC(6,2) NOT NULL,
         p90 NUMERIC(6,2) NOT NULL,
         computed_at TIMESTAMPTZ NOT NULL DEFAULT now()
       )`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query('DROP TABLE IF EXISTS photo_colours');
  await sequelize.query('DROP TABLE IF EXISTS designs');
};
