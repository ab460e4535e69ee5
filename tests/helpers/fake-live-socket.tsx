/**
 * A stand-in for the app's live connection (`src/lib/socket`) in unit tests of the live hooks: the
 * test answers the room's join when it chooses and sends events through the handlers the hook
 * registered. Use with `vi.mock('../../src/lib/socket', () => import('../helpers/fake-live-socket'))`
 * and import `live` from here (the same module instance).
 */
import { render } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { ReactElement, ReactNode } from 'react';

const handlers = new Map<string, (...args: unknown[]) => void>();
let answerJoin: (joined: unknown) => void = () => {};

const socket = {
  connected: true,
  on: (event: string, fn: (...args: unknown[]) => void) => handlers.set(event, fn),
  off: (event: string) => handlers.delete(event),
  emit: () => {},
};

export const getSocket = () => socket;

/** Every emit with an answer is a join here: it waits for `live.answer`. */
export const emitWithAck = () =>
  new Promise((resolve) => {
    answerJoin = resolve;
  });

export const live = {
  handlers,
  /** Answers the join under way. */
  answer: (joined: unknown) => answerJoin(joined),
};

/** A query client that does not retry, for one test. */
export const newQueryClient = () => new QueryClient({ defaultOptions: { queries: { retry: false } } });

/** Renders `ui` with `client` (a fresh one unless given, to share a cache across renders). */
export function renderWithClient(ui: ReactElement, client = newQueryClient()) {
  const wrapper = ({ children }: { children: ReactNode }) => (
    <QueryClientProvider client={client}>{children}</QueryClientProvider>
  );
  return render(ui, { wrapper });
}
