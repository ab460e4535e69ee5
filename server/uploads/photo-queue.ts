/**
 * Re-encoding photos is the heaviest work the server does (a 10000 × 10000 picture is 100 megapixels to
 * decode). It runs here, never inside a database transaction or lock, through a small bounded queue:
 * at most `concurrency` photos at once (fitted to the cores, leaving one for everything else) and at
 * most `limit` photos admitted (running plus waiting). A batch that does not fit is refused whole with
 * 503 and Retry-After, before it takes memory or CPU, and the person is told to send it again shortly.
 */
import { availableParallelism } from 'node:os';
import sharp from 'sharp';
import { MAX_PHOTOS_PER_UPLOAD } from '@shared/schemas/photos';
import { AppError } from '../http/errors';

export class PhotosBusyError extends AppError {
  constructor(readonly retryAfterSeconds: number) {
    super(
      503,
      'photos_busy',
      `The server is busy preparing other people’s photos. Nothing was saved; please send your photos again in ` +
        `${retryAfterSeconds} seconds.`,
    );
  }
}

export interface PhotoQueueOptions {
  concurrency?: number;
  limit?: number;
}

/** One photo at a time on a one- or two-core machine, up to 4 on a large one. */
export function defaultConcurrency(cores = availableParallelism()): number {
  return Math.max(1, Math.min(4, cores - 1));
}

/**
 * Threads libvips may use for one image. By default it takes every core for each image, so a single
 * 100-megapixel decode would still crowd out everything else; one core fewer leaves room for requests.
 */
export function limitImageThreads(cores = availableParallelism()): void {
  sharp.concurrency(Math.max(1, cores - 1));
}

export class PhotoQueue {
  readonly concurrency: number;
  readonly limit: number;
  private running = 0;
  private admitted = 0;
  private readonly waiting: (() => void)[] = [];
  /** Recent time per photo, to say when to come back. */
  private averageMs = 1000;

  constructor(opts: PhotoQueueOptions = {}) {
    this.concurrency = Math.max(1, opts.concurrency ?? defaultConcurrency());
    // Room for the largest batch at least, and by default for a few people's batches at once.
    this.limit = Math.max(MAX_PHOTOS_PER_UPLOAD, this.concurrency, opts.limit || MAX_PHOTOS_PER_UPLOAD * 2);
  }

  /** Photos running or waiting. */
  get load(): number {
    return this.admitted;
  }

  /** Seconds until room is likely, for Retry-After: the queue ahead of us worked at the recent pace. */
  retryAfterSeconds(): number {
    return Math.min(120, Math.max(1, Math.ceil(((this.admitted / this.concurrency) * this.averageMs) / 1000)));
  }

  /** Refuses now when there is no room for `count` more photos (checked before an upload's body is read). */
  assertRoom(count = 1): void {
    if (this.admitted + count > this.limit) throw new PhotosBusyError(this.retryAfterSeconds());
  }

  /**
   * Runs one task per photo, admitted together or refused together (PhotosBusyError). Results come
   * back in order; the first failure rejects after the batch's other running tasks settle.
   */
  async runBatch<T>(tasks: readonly (() => Promise<T>)[]): Promise<T[]> {
    this.assertRoom(tasks.length);
    this.admitted += tasks.length;
    let left = tasks.length;
    const release = () => {
      left -= 1;
      this.admitted -= 1;
    };
    try {
      // One at a time within a batch keeps a batch's memory bounded; other batches use the other slots.
      const results: T[] = [];
      for (const task of tasks) {
        results.push(await this.slot(task));
        release();
      }
      return results;
    } finally {
      this.admitted -= left;
    }
  }

  private async slot<T>(task: () => Promise<T>): Promise<T> {
    // A finishing task hands its slot straight to the next in line, so none is taken twice.
    if (this.running < this.concurrency) this.running += 1;
    else await new Promise<void>((resolve) => this.waiting.push(resolve));
    const started = Date.now();
    try {
      return await task();
    } finally {
      this.averageMs = this.averageMs * 0.7 + (Date.now() - started) * 0.3;
      const next = this.waiting.shift();
      if (next) next();
      else this.running -= 1;
    }
  }
}

const queues = new Map<number, PhotoQueue>();

/** The process's photo queue (one per configured limit; 0 means the default). */
export function photoQueue(config: { PHOTO_QUEUE_LIMIT?: number }): PhotoQueue {
  const limit = config.PHOTO_QUEUE_LIMIT ?? 0;
  let queue = queues.get(limit);
  if (!queue) {
    limitImageThreads();
    queues.set(limit, (queue = new PhotoQueue({ limit })));
  }
  return queue;
}
