/**
 * The intake view's store on the device (IndexedDB through `idb`): each swap's pack, and the queue of
 * actions waiting to reach the server, in the order they were taken.
 */
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { IntakePackDto } from '@shared/schemas/intake';
import type { VerdictName } from '@shared/swap-types';
import type { MeasurementSend } from '@/entities/block/api/measure-block';
import { INTAKE_DB_NAME } from './db-name';

export interface QueueItem {
  /** position in the queue, given by IndexedDB */
  seq?: number;
  clientId: string;
  kind: 'receive' | 'measure';
  swapId: number;
  blockId: number;
  /** who took the action; only they send it */
  userId: number;
  body?: MeasurementSend;
  /** "Block 2 of 4 · Ada" for the waiting list */
  label: string;
  localVerdict?: VerdictName;
  createdAt: string;
  attempts: number;
  failed?: { code: string; message: string };
}

export interface StoredPack extends IntakePackDto {
  savedAt: string;
}

interface IntakeSchema extends DBSchema {
  packs: { key: number; value: StoredPack };
  queue: { key: number; value: QueueItem; indexes: { swap: number } };
}

let opening: Promise<IDBPDatabase<IntakeSchema>> | null = null;

export function intakeDb(): Promise<IDBPDatabase<IntakeSchema>> {
  opening ??= openDB<IntakeSchema>(INTAKE_DB_NAME, 1, {
    upgrade(db) {
      db.createObjectStore('packs', { keyPath: 'swap.id' });
      db.createObjectStore('queue', { keyPath: 'seq', autoIncrement: true }).createIndex('swap', 'swapId');
    },
  });
  return opening;
}

export async function savePack(pack: IntakePackDto): Promise<StoredPack> {
  const stored = { ...pack, savedAt: new Date().toISOString() };
  await (await intakeDb()).put('packs', stored);
  return stored;
}

export async function loadPack(swapId: number): Promise<StoredPack | undefined> {
  return (await intakeDb()).get('packs', swapId);
}

export async function enqueue(item: Omit<QueueItem, 'seq' | 'attempts' | 'createdAt'>): Promise<number> {
  return (await intakeDb()).add('queue', { ...item, attempts: 0, createdAt: new Date().toISOString() });
}

/** Every queued item, oldest first. */
export async function queuedItems(): Promise<QueueItem[]> {
  return (await intakeDb()).getAll('queue');
}

export async function removeItem(seq: number): Promise<void> {
  await (await intakeDb()).delete('queue', seq);
}

export async function updateItem(item: QueueItem): Promise<void> {
  await (await intakeDb()).put('queue', item);
}
