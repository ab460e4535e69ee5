/**
 * Photos in an S3-compatible bucket through the AWS SDK: `<S3_PREFIX>photos/<name>`. The bucket stays
 * private; the app streams photos to members after its own permission check.
 */
import { Readable } from 'node:stream';
import {
  DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command, NoSuchKey, PutObjectCommand, S3Client, S3ServiceException,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { assertStoredName, MARKER_NAME, readAll, STORED_NAME, type PhotoStorage, type StorageConfig } from './photo-storage';

// Files above this go up in parts (re-encoded photos rarely do; copies of originals might).
const PART_BYTES = 8 * 1024 * 1024;

export function s3Client(config: StorageConfig): S3Client {
  const keys =
    config.S3_ACCESS_KEY_ID && config.S3_SECRET_ACCESS_KEY
      ? { credentials: { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY } }
      : {};
  return new S3Client({
    region: config.S3_REGION ?? 'us-east-1',
    ...(config.S3_ENDPOINT ? { endpoint: config.S3_ENDPOINT } : {}),
    forcePathStyle: config.S3_FORCE_PATH_STYLE ?? false,
    // Checksums only where the API requires them: many self-hosted stores reject the newer trailers.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    ...keys,
  });
}

const isMissing = (error: unknown) =>
  error instanceof NoSuchKey || (error instanceof S3ServiceException && (error.name === 'NotFound' || error.$metadata.httpStatusCode === 404));

export function s3Storage(config: StorageConfig, client: S3Client = s3Client(config)): PhotoStorage {
  const bucket = config.S3_BUCKET ?? 'blockpost-photos';
  const prefix = `${config.S3_PREFIX ?? ''}photos/`;
  const key = (name: string) => {
    assertStoredName(name);
    return `${prefix}${name}`;
  };
  const markerKey = `${prefix}${MARKER_NAME}`;
  return {
    kind: 's3',
    description: `the bucket “${bucket}”${config.S3_PREFIX ? ` under “${config.S3_PREFIX}”` : ''}${config.S3_ENDPOINT ? ` at ${config.S3_ENDPOINT}` : ''}`,

    async put(name, data) {
      const Key = key(name);
      // An object appears whole or not at all; large bodies go in parts, completed in one call.
      if (data.length <= PART_BYTES) {
        await client.send(new PutObjectCommand({ Bucket: bucket, Key, Body: data, ContentLength: data.length }));
        return;
      }
      await new Upload({ client, params: { Bucket: bucket, Key, Body: data }, partSize: PART_BYTES, queueSize: 2 }).done();
    },

    async get(name) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key(name) }));
        if (!(out.Body instanceof Readable)) throw new Error('The object store answered without a readable body.');
        return { body: out.Body, bytes: out.ContentLength ?? 0 };
      } catch (error) {
        if (isMissing(error)) return null;
        throw error;
      }
    },

    async remove(name) {
      // Deleting a key that is not there succeeds in S3, so removal is idempotent.
      await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key(name) }));
    },

    async *list() {
      let ContinuationToken: string | undefined;
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: prefix, ContinuationToken }));
        for (const item of page.Contents ?? []) {
          const name = item.Key?.slice(prefix.length) ?? '';
          if (STORED_NAME.test(name)) yield { name, bytes: item.Size ?? 0 };
        }
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (ContinuationToken);
    },

    async readMarker() {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: markerKey }));
        return out.Body instanceof Readable ? (await readAll(out.Body)).toString('utf8') : null;
      } catch (error) {
        if (isMissing(error)) return null;
        throw error;
      }
    },

    async writeMarker(content) {
      // If-None-Match: the first install to claim the bucket keeps it (stores without the header
      // overwrite; the caller reads the marker back to find out who won).
      try {
        await client.send(new PutObjectCommand({ Bucket: bucket, Key: markerKey, Body: content, IfNoneMatch: '*', ContentType: 'application/json' }));
      } catch (error) {
        if (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 412) {
          throw Object.assign(new Error('The store already has an owner marker.'), { code: 'EEXIST' });
        }
        throw error;
      }
    },
  };
}
