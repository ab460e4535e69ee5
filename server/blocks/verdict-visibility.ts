/**
 * Who may read the verdicts on a maker's blocks: the maker always, the guild's officers always, and
 * everyone else only when the guild shows verdicts to the whole guild. What is hidden is left out of
 * the answer altogether (not sent as null), so nothing in it hints at the verdict.
 */
import type { BlockDto, RosterDto, RosterRowDto } from '@shared/swap-types';
import type { ActivityDto } from '@shared/live-events';
import type { VerdictsVisibleTo } from '@shared/schemas/guilds';
import { Guild } from '../db/models';

export interface VerdictViewer {
  userId: number;
  /** coordinators and admins */
  canManage: boolean;
}

/** True when the viewer sees every maker's verdicts in this guild. */
export function seesAllVerdicts(viewer: VerdictViewer, visibleTo: VerdictsVisibleTo): boolean {
  return viewer.canManage || visibleTo === 'guild';
}

export async function guildVerdictsVisibleTo(guildId: number): Promise<VerdictsVisibleTo> {
  const guild = await Guild.findByPk(guildId, { attributes: ['verdictsVisibleTo'] });
  return guild?.verdictsVisibleTo ?? 'officers';
}

/**
 * Whether the viewer sees every maker's verdicts: officers without a read, anyone else by the guild's
 * setting, taken from the policy's read of the swap where it gave it (`known`), else read here.
 */
export async function viewerSeesAllVerdicts(
  viewer: VerdictViewer,
  guildId: number,
  known: VerdictsVisibleTo | undefined,
): Promise<boolean> {
  return viewer.canManage || seesAllVerdicts(viewer, known ?? (await guildVerdictsVisibleTo(guildId)));
}

/** A roster row without its verdicts: counts along the way stay, verdicts, acceptance and estimates go. */
export function rowWithoutVerdicts(row: RosterRowDto): RosterRowDto {
  const { verdicts: _v, accepted: _a, ...rest } = row;
  return {
    ...rest,
    blocks: row.blocks.map(({ verdict: _verdict, trimmed: _t, acceptedByDecision: _d, photoEstimate: _e, ...b }) => b),
  };
}

/** The roster as `viewerId` may read it (null: nobody's row is theirs), when they do not see every maker's verdicts. */
export function rosterForMember<T extends Pick<RosterDto, 'rows'>>(roster: T, viewerId: number | null): T {
  return { ...roster, rows: roster.rows.map((r) => (r.userId === viewerId ? r : rowWithoutVerdicts(r))) };
}

/** A block answer without its verdict, acceptance, measurements and photo estimate. */
export function blockWithoutVerdict(dto: BlockDto): BlockDto {
  const { verdict: _v, trimmed: _t, accepted: _a, decision: _d, latest: _l, photoEstimate: _e, ...rest } = dto;
  return { ...rest, times: { ...dto.times, trimmed: null } };
}

/** Activity lines as `viewerId` may read them: other makers' lines lose their verdict (the line itself stays). */
export function activitiesForMember(activities: ActivityDto[], viewerId: number | null): ActivityDto[] {
  return activities.map((a) => {
    if (a.subject?.userId === viewerId || !('verdict' in a.detail)) return a;
    const { verdict: _verdict, ...detail } = a.detail;
    return { ...a, detail };
  });
}
