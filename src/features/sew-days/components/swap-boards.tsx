import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { swapStateShort } from '@shared/schemas/swaps';
import type { SwapSummaryDto } from '@shared/swap-types';
import { paths } from '@/lib/paths';
import { swapsQueryOptions } from '@/entities/swap/api/get-swaps';

const running = new Set(['signup', 'sewing', 'collecting', 'sorting']);
const underWay = (swaps: SwapSummaryDto[]) => swaps.filter((s) => running.has(s.state));

/** Links to the live boards and chats of the swaps under way: what a sew day usually talks about. */
export function SwapBoards({ guildId }: { guildId: number }) {
  const swaps = useQuery({ ...swapsQueryOptions(guildId), select: underWay });
  if (!swaps.data || swaps.data.length === 0) return null;
  return (
    <section aria-labelledby="swap-boards" className="rounded-card bg-card p-5 ring-1 ring-walnut/10">
      <h2 id="swap-boards" className="text-xl font-semibold text-indigo-deep">
        Swaps under way
      </h2>
      <ul className="mt-2 divide-y divide-walnut/10">
        {swaps.data.map((s) => (
          <li key={s.id} className="flex flex-wrap items-center justify-between gap-x-4 py-2">
            <span>
              <span className="font-semibold">{s.title}</span>{' '}
              <span className="text-walnut-soft">· {swapStateShort[s.state]}</span>
            </span>
            <span className="flex gap-4">
              <Link
                className="inline-flex min-h-11 min-w-11 items-center justify-center font-semibold text-indigo underline"
                to={paths.swapBoard(guildId, s.id)}
              >
                Live board<span className="sr-only"> of {s.title}</span>
              </Link>
              <Link
                className="inline-flex min-h-11 min-w-11 items-center justify-center font-semibold text-indigo underline"
                to={paths.swapChat(guildId, s.id)}
              >
                Chat<span className="sr-only"> about {s.title}</span>
              </Link>
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
