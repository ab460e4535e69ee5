import { NavLink, Outlet, useParams } from 'react-router';
import { swapStateLabels } from '@shared/schemas/swaps';
import { Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useSwap } from '@/entities/swap/api/get-swap';
import { SwapStateBadge } from './state-badge';

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center rounded-lg px-3 font-semibold ${isActive ? 'bg-indigo text-white' : 'text-indigo hover:bg-linen-deep'}`;

/** A swap's title, state and sections. */
export function SwapLayout() {
  const params = useParams();
  const guildId = Number(params.guildId);
  const swapId = Number(params.swapId);
  const swap = useSwap(swapId);
  if (swap.isPending) return <Loading label="Loading the swap…" />;
  if (swap.isError) return <QueryError error={swap.error} what="the swap" />;
  const s = swap.data;
  return (
    <div className="space-y-6">
      <header className="print:hidden">
        <div className="flex flex-wrap items-center gap-3">
          <h2 className="text-3xl font-bold text-indigo-deep">{s.title}</h2>
          <SwapStateBadge state={s.state} />
        </div>
        <p className="text-walnut-soft">{swapStateLabels[s.state]}</p>
        <nav aria-label="Swap sections" className="mt-3 flex flex-wrap gap-1">
          <NavLink end to={paths.swap(guildId, swapId)} className={tabClass}>
            Overview
          </NavLink>
          {s.state !== 'draft' && (
            <NavLink to={paths.swapRoster(guildId, swapId)} className={tabClass}>
              Roster
            </NavLink>
          )}
          {s.canManage && ['collecting', 'sorting', 'complete'].includes(s.state) && (
            <NavLink to={paths.swapReturn(guildId, swapId)} className={tabClass}>
              Return of blocks
            </NavLink>
          )}
          {s.state !== 'draft' && (
            <NavLink to={paths.swapBoard(guildId, swapId)} className={tabClass}>
              Live board
            </NavLink>
          )}
          {s.state !== 'draft' && (
            <NavLink to={paths.swapChat(guildId, swapId)} className={tabClass}>
              Swap chat
            </NavLink>
          )}
          <NavLink to={paths.swapSheet(guildId, swapId)} className={tabClass}>
            Swap sheet
          </NavLink>
          {(s.fees.entry > 0 || s.fees.postage > 0) && (
            <NavLink to={paths.swapFees(guildId, swapId)} className={tabClass}>
              Fees
            </NavLink>
          )}
          {['sewing', 'collecting', 'sorting', 'complete'].includes(s.state) && (
            <NavLink to={paths.swapDesign(guildId, swapId)} className={tabClass}>
              Design wall
            </NavLink>
          )}
          {(s.myPledge > 0 || s.canManage) && ['signup', 'sewing', 'collecting'].includes(s.state) && (
            <NavLink to={paths.swapLabels(guildId, swapId)} className={tabClass}>
              Labels
            </NavLink>
          )}
          {s.canManage && ['sewing', 'collecting', 'sorting'].includes(s.state) && (
            <NavLink to={paths.swapIntake(guildId, swapId)} className={tabClass}>
              Intake
            </NavLink>
          )}
          {s.canManage && s.state !== 'complete' && s.state !== 'cancelled' && (
            <NavLink to={paths.editSwap(guildId, swapId)} className={tabClass}>
              Edit
            </NavLink>
          )}
        </nav>
      </header>
      <Outlet />
    </div>
  );
}
