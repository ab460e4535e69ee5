import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import type { ActivityDto, BoardPatch } from '../../shared/live-events';
import type { RosterDto, RosterRowDto } from '../../shared/swap-types';
import { applyBoardPatch, boardChangeStep } from '../../src/entities/roster/api/apply-board-patch';
import { markStaleAfterChange } from '../../src/entities/roster/api/mark-stale-after-change';
import { blockKeys } from '../../src/entities/block/api/block-keys';
import { swapKeys } from '../../src/entities/swap/api/swap-keys';
import { prependActivities } from '../../src/features/live-board/hooks/prepend-activities';

const counts = { pledged: 0, sewn: 0, handedIn: 0, received: 0, measured: 0, returned: 0 };
const verdicts = { true: 0, trim: 0, short: 0, skewed: 0 };

function row(userId: number, displayName: string, pledged = 2): RosterRowDto {
  return { ...counts, verdicts, pledged, userId, displayName, owed: pledged, accepted: 0, blocks: [] } as RosterRowDto;
}

function roster(rows: RosterRowDto[]): RosterDto {
  return {
    swap: { id: 7, state: 'collecting', unfinished: { width: 9.5, height: 9.5 }, title: 'Lantern Nine-Patch', mode: 'return' },
    totals: { ...counts, verdicts, accepted: 0, members: rows.length } as RosterDto['totals'],
    rows,
  };
}

function patch(p: Partial<BoardPatch>): BoardPatch {
  return { swap: roster([]).swap, totals: roster([]).totals, rows: [], removedUserIds: [], complete: false, ...p };
}

describe('applying a live board change to the cached roster', () => {
  const before = roster([row(1, 'Ada'), row(2, 'Bea'), row(3, 'Cyd')]);

  it('replaces a changed row in place and leaves the others as they were', () => {
    const measured = { ...row(2, 'Bea'), measured: 1, owed: 1 };
    const after = applyBoardPatch(before, patch({ rows: [measured] }));
    expect(after.rows.map((r) => [r.displayName, r.measured])).toEqual([
      ['Ada', 0],
      ['Bea', 1],
      ['Cyd', 0],
    ]);
    expect(after.rows[0]).toBe(before.rows[0]);
  });

  it('adds a new sign-up in name order, ignoring case, and drops a withdrawn one', () => {
    const after = applyBoardPatch(before, patch({ rows: [row(9, 'bo')], removedUserIds: [3] }));
    expect(after.rows.map((r) => r.displayName)).toEqual(['Ada', 'Bea', 'bo']);
  });

  it('orders two people of the same name by their id, so the rows never swap places', () => {
    const after = applyBoardPatch(roster([row(5, 'Ada')]), patch({ rows: [row(4, 'Ada')] }));
    expect(after.rows.map((r) => r.userId)).toEqual([4, 5]);
  });

  it('takes the totals and the swap’s fields from the change', () => {
    const totals = { ...before.totals, measured: 3 };
    const after = applyBoardPatch(before, patch({ totals, swap: { ...before.swap, state: 'sorting' } }));
    expect(after.totals.measured).toBe(3);
    expect(after.swap.state).toBe('sorting');
    expect(after.swap.title).toBe('Lantern Nine-Patch');
  });

  it('replaces every row when the change is complete (after a redistribution)', () => {
    const after = applyBoardPatch(before, patch({ rows: [row(3, 'Cyd', 4)], complete: true }));
    expect(after.rows.map((r) => [r.userId, r.pledged])).toEqual([[3, 4]]);
  });

  it('leaves the cached roster itself untouched', () => {
    const copy = structuredClone(before);
    applyBoardPatch(before, patch({ rows: [row(9, 'Eve')], removedUserIds: [1] }));
    expect(before).toEqual(copy);
  });
});

describe('adding a change’s activity lines to the board’s list', () => {
  const line = (id: number): ActivityDto => ({
    id,
    swapId: 7,
    kind: 'block.measured',
    actor: null,
    subject: null,
    blockId: id,
    detail: {},
    at: '',
  });

  it('puts new lines on top, newest first, without repeating one already shown', () => {
    const list = prependActivities([line(3), line(2)], [line(5), line(3), line(4)], 20);
    expect(list.map((a) => a.id)).toEqual([5, 4, 3, 2]);
  });

  it('keeps at most the number asked for, dropping the oldest', () => {
    const list = prependActivities([line(2), line(1)], [line(4), line(3)], 3);
    expect(list.map((a) => a.id)).toEqual([4, 3, 2]);
  });
});

describe('deciding what a numbered board change does to the cached roster', () => {
  const change = (version: number, withPatch = true) => ({ version, patch: withPatch ? patch({}) : null });

  it('patches the next change in line into the cached roster', () => {
    expect(boardChangeStep(4, change(5), true)).toBe('patch');
  });

  it('ignores a change already seen, and every change before the view has joined', () => {
    expect(boardChangeStep(5, change(5), true)).toBe('ignore');
    expect(boardChangeStep(5, change(3), true)).toBe('ignore');
    expect(boardChangeStep(null, change(1), true)).toBe('ignore');
  });

  it('fetches the roster again after a gap, for a change without a patch, or when nothing is cached', () => {
    expect(boardChangeStep(4, change(6), true)).toBe('refetch');
    expect(boardChangeStep(4, change(5, false), true)).toBe('refetch');
    expect(boardChangeStep(4, change(5), false)).toBe('refetch');
  });
});

describe('marking what else shows a board change as stale', () => {
  const withBlocks = (userId: number, ids: number[]) =>
    ({ ...row(userId, `Maker ${userId}`), blocks: ids.map((id) => ({ id })) }) as RosterRowDto;

  function cache() {
    const queryClient = new QueryClient();
    queryClient.setQueryData(swapKeys.detail(7), { id: 7, state: 'collecting', pledged: 0 });
    queryClient.setQueryData(blockKeys.list(7, 'mine'), [{ id: 21 }, { id: 22 }]);
    queryClient.setQueryData(blockKeys.list(7, 'all'), [{ id: 21 }, { id: 22 }, { id: 31 }]);
    queryClient.setQueryData(blockKeys.measurements(21), []);
    queryClient.setQueryData(blockKeys.measurements(31), []);
    const stale = () =>
      queryClient
        .getQueryCache()
        .getAll()
        .filter((q) => q.state.isInvalidated)
        .map((q) => q.queryKey.join(' '))
        .sort();
    return { queryClient, stale };
  }

  it('marks the touched block, the lists holding it and the officers’ full list, not the rest', async () => {
    const { queryClient, stale } = cache();
    await markStaleAfterChange(queryClient, 7, patch({ rows: [withBlocks(9, [31])] }));
    expect(stale()).toEqual(['swaps block 31 measurements', 'swaps detail 7 blocks all']);
  });

  it('marks the swap when its state or pledges moved', async () => {
    const { queryClient, stale } = cache();
    await markStaleAfterChange(queryClient, 7, patch({ swap: { ...roster([]).swap, state: 'sorting' } }));
    expect(stale()).toContain('swaps detail 7');
  });

  it('marks everything of the swap when the change carries no patch (something was missed)', async () => {
    const { queryClient, stale } = cache();
    await markStaleAfterChange(queryClient, 7, null);
    expect(stale()).toEqual([
      'swaps block 21 measurements',
      'swaps block 31 measurements',
      'swaps detail 7',
      'swaps detail 7 blocks all',
      'swaps detail 7 blocks mine',
    ]);
  });
});
