/** The photo suites run once per photo store driver: the local folder and the fake S3 bucket. */
import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import type { TestApp } from '../helpers/test-app';
import { storageOf } from '../../server/uploads/photo-store';

export const photoDrivers = ['local', 's3'] as const;
export type PhotoDriver = (typeof photoDrivers)[number];

/** Config overrides for a driver; each S3 app gets a key prefix of its own in the shared fake bucket. */
export function driverEnv(driver: PhotoDriver): Record<string, string> {
  if (driver === 'local') return {};
  return { ...inject('s3Env'), S3_PREFIX: `t-${randomBytes(6).toString('hex')}/` };
}

/** Names of the photo files in an app's store, sorted (read from the folder or the bucket itself). */
export async function storedNames(app: Pick<TestApp, 'deps'>): Promise<string[]> {
  const names: string[] = [];
  for await (const item of storageOf(app.deps).list()) names.push(item.name);
  return names.sort();
}

export async function isStored(app: Pick<TestApp, 'deps'>, name: string): Promise<boolean> {
  const file = await storageOf(app.deps).get(name);
  file?.body.destroy();
  return file !== null;
}
