import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
};
// Lengths are exact decimals of an inch, never floats (⅛″ and 1/16″ steps are exact in 4 places).
const inches = (allowNull = false) => ({ type: DataTypes.DECIMAL(8, 4), allowNull });
const userRef = (allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: 'users', key: 'id' },
  onDelete,
});

export const up: Migration = async ({ context: { queryInterface, sequelize } }) => {
  await sequelize.transaction(async (transaction) => {
    await queryInterface.createTable(
      'swaps',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        guild_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'guilds', key: 'id' }, onDelete: 'CASCADE' },
        title: { type: DataTypes.STRING(120), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        block_spec: { type: DataTypes.JSONB, allowNull: false },
        seam: inches(),
        unfinished_width: inches(),
        unfinished_height: inches(),
        finished_width: inches(),
        finished_height: inches(),
        tolerance: inches(),
        squareness: inches(),
        colour_rules: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        quota_min: { type: DataTypes.INTEGER, allowNull: false },
        quota_max: { type: DataTypes.INTEGER, allowNull: false },
        signup_closes_at: { type: DataTypes.DATE, allowNull: false },
        due_at: { type: DataTypes.DATE, allowNull: false },
        signup_reminder_days: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 7 },
        due_reminder_days: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 2 },
        mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'return' },
        gift_recipient_id: userRef(true, 'SET NULL'),
        gift_recipient_name: { type: DataTypes.STRING(120), allowNull: true },
        state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'draft' },
        created_by_id: userRef(true, 'SET NULL'),
        distribution_confirmed_at: { type: DataTypes.DATE, allowNull: true },
        distribution_confirmed_by_id: userRef(true, 'SET NULL'),
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('swaps', ['guild_id', 'state'], { transaction });

    await queryInterface.createTable(
      'swap_transitions',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        swap_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'swaps', key: 'id' }, onDelete: 'CASCADE' },
        from_state: { type: DataTypes.STRING(16), allowNull: true },
        to_state: { type: DataTypes.STRING(16), allowNull: false },
        by_id: userRef(true, 'SET NULL'),
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        reason: { type: DataTypes.STRING(500), allowNull: true },
      },
      { transaction },
    );
    await queryInterface.addIndex('swap_transitions', ['swap_id', 'at'], { transaction });

    await queryInterface.createTable(
      'signups',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        swap_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'swaps', key: 'id' }, onDelete: 'CASCADE' },
        user_id: userRef(false, 'CASCADE'),
        blocks: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'active' },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('signups', ['swap_id', 'user_id'], { unique: true, transaction });
    await queryInterface.addIndex('signups', ['user_id'], { transaction });

    await queryInterface.createTable(
      'blocks',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        swap_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'swaps', key: 'id' }, onDelete: 'CASCADE' },
        maker_id: userRef(false, 'CASCADE'),
        sequence: { type: DataTypes.INTEGER, allowNull: false },
        state: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'pledged' },
        hand_in_how: { type: DataTypes.STRING(16), allowNull: true },
        hand_in_note: { type: DataTypes.STRING(500), allowNull: true },
        trimmed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        trimmed_at: { type: DataTypes.DATE, allowNull: true },
        // The verdict of the latest ruler measurement, kept here so rosters need no per-block lookup.
        verdict: { type: DataTypes.STRING(16), allowNull: true },
        recipient_id: userRef(true, 'SET NULL'),
        received_by_id: userRef(true, 'SET NULL'),
        sewn_at: { type: DataTypes.DATE, allowNull: true },
        handed_in_at: { type: DataTypes.DATE, allowNull: true },
        received_at: { type: DataTypes.DATE, allowNull: true },
        measured_at: { type: DataTypes.DATE, allowNull: true },
        returned_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('blocks', ['swap_id', 'maker_id', 'sequence'], { unique: true, transaction });
    await queryInterface.addIndex('blocks', ['maker_id'], { transaction });
    await queryInterface.addIndex('blocks', ['recipient_id'], { transaction });

    await queryInterface.createTable(
      'measurements',
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        block_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'blocks', key: 'id' }, onDelete: 'CASCADE' },
        measured_by_id: userRef(true, 'SET NULL'),
        // A string with a named CHECK, so a later migration can add sources (e.g. 'photo').
        source: { type: DataTypes.STRING(16), allowNull: false },
        width: inches(),
        height: inches(),
        diagonal1: inches(true),
        diagonal2: inches(true),
        verdict: { type: DataTypes.STRING(16), allowNull: false },
        deviation_width: { type: DataTypes.DECIMAL(9, 4), allowNull: false },
        deviation_height: { type: DataTypes.DECIMAL(9, 4), allowNull: false },
        deviation_diagonal: { type: DataTypes.DECIMAL(9, 4), allowNull: true },
        note: { type: DataTypes.STRING(500), allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('measurements', ['block_id', 'source', 'created_at'], { transaction });

    // Offline tools repeat a request with the same clientId; the first answer is kept and replayed.
    await queryInterface.createTable(
      'block_requests',
      {
        client_id: { type: DataTypes.UUID, primaryKey: true },
        user_id: userRef(true, 'SET NULL'),
        block_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'blocks', key: 'id' }, onDelete: 'CASCADE' },
        action: { type: DataTypes.STRING(32), allowNull: false },
        status_code: { type: DataTypes.INTEGER, allowNull: true },
        response: { type: DataTypes.JSONB, allowNull: true },
        created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { transaction },
    );

    await queryInterface.sequelize.query(
      `ALTER TABLE swaps ADD CONSTRAINT swaps_state_check
         CHECK (state IN ('draft','signup','sewing','collecting','sorting','complete','cancelled'));
       ALTER TABLE swaps ADD CONSTRAINT swaps_mode_check CHECK (mode IN ('return','gift'));
       ALTER TABLE swaps ADD CONSTRAINT swaps_quota_check CHECK (quota_min >= 1 AND quota_max >= quota_min);
       ALTER TABLE swaps ADD CONSTRAINT swaps_dates_check CHECK (due_at > signup_closes_at);
       ALTER TABLE swaps ADD CONSTRAINT swaps_lengths_check
         CHECK (unfinished_width > 0 AND unfinished_height > 0 AND tolerance >= 0 AND squareness >= 0 AND seam >= 0);
       ALTER TABLE swap_transitions ADD CONSTRAINT swap_transitions_to_check
         CHECK (to_state IN ('draft','signup','sewing','collecting','sorting','complete','cancelled'));
       ALTER TABLE signups ADD CONSTRAINT signups_status_check CHECK (status IN ('active','withdrawn'));
       ALTER TABLE signups ADD CONSTRAINT signups_blocks_check CHECK (blocks >= 0);
       ALTER TABLE blocks ADD CONSTRAINT blocks_state_check
         CHECK (state IN ('pledged','sewn','handed_in','received','measured','returned'));
       ALTER TABLE blocks ADD CONSTRAINT blocks_hand_in_how_check CHECK (hand_in_how IS NULL OR hand_in_how IN ('in-person','post'));
       ALTER TABLE blocks ADD CONSTRAINT blocks_verdict_check CHECK (verdict IS NULL OR verdict IN ('true','trim','short','skewed'));
       ALTER TABLE blocks ADD CONSTRAINT blocks_sequence_check CHECK (sequence >= 1);
       ALTER TABLE measurements ADD CONSTRAINT measurements_source_check CHECK (source IN ('ruler','maker'));
       ALTER TABLE measurements ADD CONSTRAINT measurements_verdict_check CHECK (verdict IN ('true','trim','short','skewed'));
       ALTER TABLE measurements ADD CONSTRAINT measurements_lengths_check CHECK (width > 0 AND height > 0);`,
      { transaction },
    );
  });
};

export const down: Migration = async ({ context: { queryInterface } }) => {
  for (const table of ['block_requests', 'measurements', 'blocks', 'signups', 'swap_transitions', 'swaps']) {
    await queryInterface.dropTable(table);
  }
};
