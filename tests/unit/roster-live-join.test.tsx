// @vitest-environment happy-dom
/**
 * Joining a swap's live board while its roster's first load is still under way: that load may have
 * read before a change made just ahead of the join, and no live message will bring the change (the
 * page was not in the room yet). The roster kept must be one read after the join.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, waitFor } from '@testing-library/react';
import { useQuery } from '@tanstack/react-query';
import type { RosterDto } from '../../shared/swap-types';
import type { ActivityDto } from '../../shared/live-events';

vi.mock('../../src/lib/socket', () => import('../helpers/fake-live-socket'));
const { live, renderWithClient } = await import('../helpers/fake-live-socket');
const { useRosterLive } = await import('../../src/entities/roster/api/use-roster-live');
const { rosterKeys } = await import('../../src/entities/roster/api/roster-keys');
const { useBoardLive } = await import('../../src/features/live-board/hooks/use-board-live');
const { liveBoardKeys } = await import('../../src/features/live-board/api/live-board-keys');

afterEach(cleanup);

/** A roster endpoint whose answers are released one at a time, each saying which read it was. */
function slowRoster() {
  const pending: Array<() => void> = [];
  let reads = 0;
  const fetchRoster = () => {
    const read = ++reads;
    return new Promise<{ read: number }>((resolve) => pending.push(() => resolve({ read })));
  };
  return { fetchRoster, pending, reads: () => reads };
}

function RosterView({ fetchRoster }: { fetchRoster: () => Promise<{ read: number }> }) {
  const roster = useQuery({ queryKey: rosterKeys.detail(7), queryFn: fetchRoster, staleTime: 60_000 });
  useRosterLive(7);
  return <p>{roster.data ? `read ${roster.data.read}` : 'loading'}</p>;
}

describe('the first join of a swap’s live board', () => {
  it('keeps a roster read after the join, even when the first load was still under way', async () => {
    const api = slowRoster();
    const { container } = renderWithClient(<RosterView fetchRoster={api.fetchRoster} />);
    await waitFor(() => expect(api.reads()).toBe(1));

    live.answer({ swapId: 7, version: 12, viewers: 1 }); // the join answers before the first load does
    await waitFor(() => expect(api.reads()).toBe(2));
    for (const release of api.pending) release();
    await waitFor(() => expect(container.textContent).toBe('read 2'));
    expect(live.handlers.has('board:changed')).toBe(true);
  });

  it('reads once more when the join answers after the first load', async () => {
    const api = slowRoster();
    const { container } = renderWithClient(<RosterView fetchRoster={api.fetchRoster} />);
    await waitFor(() => expect(api.reads()).toBe(1));
    api.pending[0]!();
    await waitFor(() => expect(container.textContent).toBe('read 1'));

    live.answer({ swapId: 7, version: 3, viewers: 1 });
    await waitFor(() => expect(api.reads()).toBe(2));
    api.pending[1]!();
    await waitFor(() => expect(container.textContent).toBe('read 2'));
  });
});

describe('a change that arrives while the roster is read again', () => {
  it('is put in after the read, which may have been taken before it was made', async () => {
    const swap = {
      id: 7,
      state: 'collecting',
      unfinished: { width: 9.5, height: 9.5 },
      title: 'Lantern Nine-Patch',
      mode: 'return',
    };
    const totals = (measured: number) => ({ measured }) as unknown as RosterDto['totals'];
    const roster = (measured: number) => ({ swap, totals: totals(measured), rows: [] }) as unknown as RosterDto;
    const pending: Array<(r: RosterDto) => void> = [];
    const fetchRoster = () => new Promise<RosterDto>((resolve) => pending.push(resolve));
    function Totals() {
      const q = useQuery({ queryKey: rosterKeys.detail(7), queryFn: fetchRoster, staleTime: 60_000 });
      useRosterLive(7);
      return <p>{q.data ? `measured ${q.data.totals.measured}` : 'loading'}</p>;
    }
    const { container } = renderWithClient(<Totals />);
    await waitFor(() => expect(pending).toHaveLength(1));
    live.answer({ swapId: 7, version: 20, viewers: 1 });
    await waitFor(() => expect(pending).toHaveLength(2)); // read again after the join
    const patch = { swap, totals: totals(1), rows: [], removedUserIds: [], complete: false };
    live.handlers.get('board:changed')!({ swapId: 7, version: 21, activities: [], patch });
    pending[1]!(roster(0)); // read just before change 21 was made
    await waitFor(() => expect(container.textContent).toBe('measured 1'));
    expect(pending).toHaveLength(2); // the change in line needed no third read
  });
});

describe('the live board’s activity list', () => {
  it('is read after the join, and keeps a line that arrives while it is read', async () => {
    const swap = {
      id: 7,
      state: 'collecting',
      unfinished: { width: 9.5, height: 9.5 },
      title: 'Lantern Nine-Patch',
      mode: 'return',
    };
    const totals = { measured: 1 } as unknown as RosterDto['totals'];
    const line = (id: number): ActivityDto => ({
      id,
      swapId: 7,
      kind: 'block.measured',
      actor: null,
      subject: null,
      blockId: id,
      detail: {},
      at: '2026-11-14T19:00:00.000Z',
    });
    const activityReads: Array<(lines: ActivityDto[]) => void> = [];
    const rosterReads: Array<(r: RosterDto) => void> = [];
    function Board() {
      useQuery({
        queryKey: rosterKeys.detail(7),
        queryFn: () => new Promise<RosterDto>((resolve) => rosterReads.push(resolve)),
        staleTime: 60_000,
      });
      const activity = useQuery({
        queryKey: liveBoardKeys.activity(7),
        queryFn: () => new Promise<ActivityDto[]>((resolve) => activityReads.push(resolve)),
        staleTime: 60_000,
      });
      useBoardLive(7);
      return <p>{activity.data ? activity.data.map((a) => a.id).join(',') || 'none' : 'loading'}</p>;
    }
    const { container } = renderWithClient(<Board />);
    await waitFor(() => expect(activityReads).toHaveLength(1));
    live.answer({ swapId: 7, version: 40, viewers: [] });
    await waitFor(() => expect(activityReads).toHaveLength(2)); // the first load, cancelled, is read again
    const patch = { swap, totals, rows: [], removedUserIds: [], complete: false };
    live.handlers.get('board:changed')!({ swapId: 7, version: 41, activities: [line(12)], patch });
    activityReads[1]!([line(11)]); // read just before line 12 was written
    for (const resolve of rosterReads) resolve({ swap, totals, rows: [] } as unknown as RosterDto);
    await waitFor(() => expect(container.textContent).toBe('12,11'));
  });
});
