import { useEffect, useRef } from 'react';
import { Link, useParams } from 'react-router';
import { swapStateShort } from '@shared/schemas/swaps';
import { Alert } from '@/components/ui/alert';
import { buttonClass } from '@/components/ui/button';
import { EmptyState, Loading, PageHeader, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useIntakePack, type IntakePack } from '../api/get-intake-pack';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import { useIntakeQueue } from '../hooks/use-intake-queue';
import { useIntakeStation } from '../hooks/use-intake-station';
import { useOnline } from '../hooks/use-online';
import { startSync } from '../offline/sync-queue';
import { CameraPanel } from './camera-panel';
import { CodeEntry } from './code-entry';
import { MeasuringCard } from './measuring-card';
import { RecentBlocks } from './recent-blocks';
import { SyncStatus } from './sync-status';
import { VerdictPanel } from './verdict-panel';
import { IntakeUndo } from './intake-undo';
import { useGuild } from '@/entities/guild/api/get-guild';

/** The coordinator's intake view for one swap: scan or type, measure, next — with or without a network. */
export function IntakePage() {
  const { swapId: swapParam, guildId } = useParams();
  const swapId = Number(swapParam);
  const viewer = useMe();
  const pack = useIntakePack(swapId);
  if (viewer.isPending || pack.isPending) return <Loading label="Getting the swap ready for intake…" />;
  if (viewer.isError) return <QueryError error={viewer.error} what="your account" />;
  if (!viewer.data) return <Loading label="Getting the swap ready for intake…" />; // signed out: the page guard sends them to sign in
  if (pack.isError) return <QueryError error={pack.error} what="this swap’s intake" />;
  return <Station pack={pack.data} userId={viewer.data.user.id} units={unitsFor(viewer.data, Number(guildId))} />;
}

const RECEIVING = ['sewing', 'collecting'];

function Station({ pack, userId, units }: { pack: IntakePack; userId: number; units: 'in' | 'mm' }) {
  const guildId = useParams().guildId ?? String(pack.swap.guildId);
  const station = useIntakeStation(pack, userId);
  const guild = useGuild(Number(guildId));
  const queue = useIntakeQueue(pack.swap.id);
  const online = useOnline();
  const codeRef = useRef<HTMLInputElement>(null);
  useEffect(() => startSync(userId), [userId]);

  const measuredCount = pack.blocks.filter((b) => b.state === 'measured').length;
  const [latest] = station.results;
  const focusCode = () => codeRef.current?.focus();

  return (
    <div>
      <PageHeader
        title={`Intake: ${pack.swap.title}`}
        lead={
          <>
            Scan a label or type its short code, then measure: <span className="hidden sm:inline">width, Tab, height, Enter</span>
            <span className="sm:hidden">width, Next, height, Save</span>. The next label is ready at once.
          </>
        }
        actions={
          <Link to={`${paths.swapLabels(guildId, pack.swap.id)}?maker=all`} className={buttonClass('secondary')}>
            Print labels
          </Link>
        }
      />
      {!RECEIVING.includes(pack.swap.state) && (
        <div className="mb-4">
          <Alert tone="warning" title={`This swap is ${swapStateShort[pack.swap.state].toLowerCase()}.`}>
            Blocks are received while a swap is sewing or collecting, and measured until it is sorted. Actions taken now will be
            refused and kept in the list below.
          </Alert>
        </div>
      )}
      <div className="grid gap-5 lg:grid-cols-2">
        <div className="space-y-4">
          <CodeEntry
            ref={codeRef}
            error={station.codeError}
            busy={station.resolving}
            onCode={station.submitCode}
            onTyping={station.clearError}
          />
          <CameraPanel
            onCode={(text) => {
              if (station.current && pack.blocks.find((b) => b.id === station.current!.id)?.reference === text) return;
              void station.submitCode(text);
            }}
          />
          {station.current && (
            <MeasuringCard
              key={station.current.id}
              block={station.current}
              target={pack.swap.unfinished}
              tolerance={pack.swap.tolerance}
              units={units}
              onMeasured={(m) => {
                void station.submitMeasurement(m);
                focusCode();
              }}
              onCancel={() => {
                station.cancel();
                focusCode();
              }}
            />
          )}
          {latest && <VerdictPanel result={latest} units={units} />}
          {latest && <IntakeUndo key={latest.clientId} swapId={pack.swap.id} result={latest} />}
          {!station.current && !latest && (
            <EmptyState title="Ready for the first block">
              {measuredCount} of {pack.blocks.length} blocks measured so far.
            </EmptyState>
          )}
        </div>
        <div className="space-y-4">
          <SyncStatus
            queue={queue}
            online={online}
            keptAt={pack.savedAt}
            fromDevice={pack.fromDevice}
            timeZone={guild.data?.timeZone}
          />
          <RecentBlocks results={station.results.slice(1)} measured={measuredCount} total={pack.blocks.length} />
        </div>
      </div>
    </div>
  );
}
