import { describe, expect, it } from 'vitest';
import { MAX_PHOTOS_PER_UPLOAD } from '@shared/schemas/photos';
import { defaultConcurrency, PhotoQueue, PhotosBusyError } from '../../server/uploads/photo-queue';

const tick = () => new Promise((r) => setTimeout(r, 5));

describe('the photo queue', () => {
  it('fits its concurrency to the cores, leaving one for everything else', () => {
    expect([1, 2, 3, 4, 8, 64].map((cores) => defaultConcurrency(cores))).toEqual([1, 1, 2, 3, 4, 4]);
  });

  it('never runs more photos at once than its concurrency, whatever the number of batches', async () => {
    const queue = new PhotoQueue({ concurrency: 2, limit: 20 });
    let running = 0;
    let most = 0;
    const task = async () => {
      running += 1;
      most = Math.max(most, running);
      await tick();
      running -= 1;
      return running;
    };
    const results = await Promise.all(Array.from({ length: 5 }, () => queue.runBatch([task, task, task])));
    expect(results.flat()).toHaveLength(15);
    expect(most).toBe(2);
    expect(queue.load).toBe(0);
  });

  it('admits a batch whole or refuses it whole, and takes the largest allowed batch when empty', async () => {
    const queue = new PhotoQueue({ concurrency: 1, limit: 1 });
    expect(queue.limit).toBe(MAX_PHOTOS_PER_UPLOAD);
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const first = queue.runBatch(Array.from({ length: MAX_PHOTOS_PER_UPLOAD - 1 }, () => () => gate));
    let ran = 0;
    await expect(queue.runBatch([async () => ran++, async () => ran++])).rejects.toBeInstanceOf(PhotosBusyError);
    expect(ran).toBe(0);
    // One more photo still fits; it waits its turn behind the first batch.
    const second = queue.runBatch([async () => ran++]);
    release();
    await Promise.all([first, second]);
    expect(ran).toBe(1);
    expect(queue.load).toBe(0);
  });

  it('frees the places of a batch that fails part-way', async () => {
    const queue = new PhotoQueue({ concurrency: 1, limit: 10 });
    await expect(
      queue.runBatch([async () => 1, async () => Promise.reject(new Error('unreadable')), async () => 3]),
    ).rejects.toThrow('unreadable');
    expect(queue.load).toBe(0);
  });
});
