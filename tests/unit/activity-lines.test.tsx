// @vitest-environment happy-dom
/**
 * The board's activity lines. While a guild keeps verdicts to its officers, the server sends a member
 * another maker's measurement line without its verdict (server/blocks/verdict-visibility.ts); the line
 * must still read as words, not break the board.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render } from '@testing-library/react';
import type { ActivityDto } from '../../shared/live-events';
import { describeActivity } from '../../src/features/live-board/components/activity-list';

afterEach(cleanup);

const measured = (detail: ActivityDto['detail']): ActivityDto => ({
  id: 4,
  swapId: 2,
  kind: 'block.measured',
  actor: { userId: 2, displayName: 'Odile Farrant' },
  subject: { userId: 11, displayName: 'Wren Halloway' },
  blockId: 29,
  detail,
  at: '2026-03-04T19:30:00.000Z',
});

describe('activity lines', () => {
  it('shows the verdict of a measurement when the line carries one', () => {
    const { container } = render(<p>{describeActivity(measured({ source: 'ruler', verdict: 'trim', sequence: 3 }))}</p>);
    expect(container.textContent).toContain('Odile Farrant measured Wren Halloway’s block 3:');
    expect(container.textContent).toMatch(/trim/i);
  });

  it('reads a measurement without its verdict (a member’s copy of another maker’s line) as words alone', () => {
    const { container } = render(<p>{describeActivity(measured({ source: 'ruler', sequence: 3 }))}</p>);
    expect(container.textContent).toBe('Odile Farrant measured Wren Halloway’s block 3');
  });
});
