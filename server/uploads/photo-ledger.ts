/**
 * The database's record of which photo files may be removed. Nothing here lists a store to guess at
 * orphans: a folder or bucket compared with one database can never prove a file is unused (another
 * install may share it). Files go only when
 * - their upload was recorded as pending before the write and never committed within the grace period, or
 * - their photo row was deleted (a trigger queues both names in that same transaction).
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { PhotoStorage } from './storage';

/** How long an upload may stay uncommitted before its files count as abandoned. */
export const PENDING_GRACE_MS = 60 * 60 * 1000;
const BATCH = 200;

/** Records names about to be written, committed on their own before a byte reaches the store. */
export async function recordPendingUploads(sequelize: Sequelize, names: readonly string[]): Promise<void> {
  if (names.length === 0) return;
  await sequelize.query('INSERT INTO photo_uploads_pending (file_name) SELECT unnest(ARRAY[:names]::varchar[])', {
    replacements: { names },
  });
}

/** Clears pending names, in the transaction that inserts their photo rows. */
export async function clearPendingUploads(sequelize: Sequelize, names: readonly string[], transaction?: Transaction): Promise<void> {
  if (names.length === 0) return;
  await sequelize.query('DELETE FROM photo_uploads_pending WHERE file_name IN (:names)', { replacements: { names }, transaction });
}

/** Names among `names` that a photo row still uses: never removed, whatever a record says. */
async function namesInUse(sequelize: Sequelize, names: readonly string[], transaction: Transaction): Promise<Set<string>> {
  if (names.length === 0) return new Set();
  const rows = await sequelize.query<{ name: string }>(
    `SELECT file_name AS name FROM photos WHERE file_name IN (:names)
     UNION SELECT thumb_file_name FROM photos WHERE thumb_file_name IN (:names)`,
    { replacements: { names }, type: QueryTypes.SELECT, transaction },
  );
  return new Set(rows.map((r) => r.name));
}

export interface LedgerDeps {
  sequelize: Sequelize;
  storage: PhotoStorage;
}

/**
 * Removes the files of uploads recorded as pending for longer than `graceMs` (a crash or a rolled-back
 * transaction between writing and committing), then their records. Rows are claimed with SKIP LOCKED,
 * so several nodes can sweep at once. Returns the names removed.
 */
export async function sweepPendingUploads(deps: LedgerDeps, graceMs = PENDING_GRACE_MS): Promise<string[]> {
  const removed: string[] = [];
  for (;;) {
    const batch = await deps.sequelize.transaction(async (transaction) => {
      const rows = await deps.sequelize.query<{ file_name: string }>(
        `SELECT file_name FROM photo_uploads_pending WHERE created_at <= now() - make_interval(secs => :seconds)
          ORDER BY created_at LIMIT :limit FOR UPDATE SKIP LOCKED`,
        { replacements: { seconds: graceMs / 1000, limit: BATCH }, type: QueryTypes.SELECT, transaction },
      );
      const names = rows.map((r) => r.file_name);
      const inUse = await namesInUse(deps.sequelize, names, transaction);
      const gone = names.filter((n) => !inUse.has(n));
      for (const name of gone) await deps.storage.remove(name);
      if (names.length) await clearPendingUploads(deps.sequelize, names, transaction);
      return { gone, more: names.length === BATCH };
    });
    removed.push(...batch.gone);
    if (!batch.more) return removed;
  }
}

/**
 * Works the deletion queue: removes each queued file from the store, then its entry. With `only`,
 * just those names (right after the deleting transaction commits); without, everything queued (the
 * periodic job picks up what a crash or a store outage left behind). Returns the names removed.
 */
export async function workDeletionQueue(deps: LedgerDeps, only?: readonly string[]): Promise<string[]> {
  if (only && only.length === 0) return [];
  const removed: string[] = [];
  for (;;) {
    const batch = await deps.sequelize.transaction(async (transaction) => {
      const rows = await deps.sequelize.query<{ file_name: string }>(
        `SELECT file_name FROM photo_file_deletions ${only ? 'WHERE file_name IN (:only)' : ''}
          ORDER BY queued_at LIMIT :limit FOR UPDATE SKIP LOCKED`,
        { replacements: { only: only ?? [], limit: BATCH }, type: QueryTypes.SELECT, transaction },
      );
      const names = rows.map((r) => r.file_name);
      const inUse = await namesInUse(deps.sequelize, names, transaction);
      const gone = names.filter((n) => !inUse.has(n));
      for (const name of gone) await deps.storage.remove(name);
      if (names.length) {
        await deps.sequelize.query('DELETE FROM photo_file_deletions WHERE file_name IN (:names)', { replacements: { names }, transaction });
      }
      return { gone, more: names.length === BATCH };
    });
    removed.push(...batch.gone);
    if (!batch.more || only) return removed;
  }
}

/** Both sweeps, as the start-up hook and the periodic job run them. */
export async function runPhotoSweeps(deps: LedgerDeps, graceMs = PENDING_GRACE_MS) {
  return { abandoned: await sweepPendingUploads(deps, graceMs), deleted: await workDeletionQueue(deps) };
}
