import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { CreateGuildInput, Role, UpdateGuildInput } from '@shared/schemas/guilds';
import type { GuildDto, InvitationDto, InvitationLimitsDto, InvitationPreviewDto, MemberDto } from '@shared/types';
import { Guild, Invitation, Membership, User } from '../db/models';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../http/errors';
import { hashToken, newToken } from '../auth/tokens';
import { assertNameFreeInGuilds } from '../auth/display-names';
import { invitationMail } from '../mail/account-messages';
import { can } from './guilds.policy';
import type { AppDeps } from '../deps';
import { guildDetail, LOCK_INVITATIONS, MEMBER_LIST, myGuilds, PAYMENT_COUNT } from './guilds.queries';
import { preparedPoolQuery } from '../db/prepared';
import { buildFromRow } from '../db/model-columns';

const INVITATION_VALID_DAYS = 14;

/** Creates a guild; its creator becomes its first admin. */
export async function createGuild(deps: Pick<AppDeps, 'sequelize'>, userId: number, input: CreateGuildInput): Promise<GuildDto> {
  const guild = await deps.sequelize.transaction(async (transaction) => {
    const created = await Guild.create({ name: input.name, timeZone: input.timeZone ?? 'UTC' }, { transaction });
    await Membership.create({ guildId: created.id, userId, role: 'admin' }, { transaction });
    return created;
  });
  return { ...guildDto(guild, 'admin'), memberCount: 1 };
}

function guildDto(guild: Guild, myRole: Role): Omit<GuildDto, 'memberCount'> {
  return {
    id: guild.id,
    name: guild.name,
    timeZone: guild.timeZone,
    currency: guild.currency,
    dues: guild.duesAmount && guild.duesYear ? { amount: guild.duesAmount, year: guild.duesYear } : null,
    defaultUnit: guild.defaultUnit,
    verdictsVisibleTo: guild.verdictsVisibleTo,
    createdAt: guild.createdAt.toISOString(),
    myRole,
  };
}

type GuildRow = Record<string, unknown> & { memberCount: number };

/** The caller's guilds by name, each with their role and its members counted, in one statement. */
export async function listMyGuilds(deps: Pick<AppDeps, 'pool'>, userId: number): Promise<GuildDto[]> {
  const rows = await preparedPoolQuery<GuildRow & { myRole: Role }>(deps.pool, myGuilds(), { userId });
  return rows.map(({ myRole, memberCount, ...guild }) => ({ ...guildDto(buildFromRow(Guild, guild), myRole), memberCount }));
}

/** The guild with its members counted, in one statement. */
export async function getGuild(deps: Pick<AppDeps, 'pool'>, guildId: number, myRole: Role): Promise<GuildDto> {
  const [row] = await preparedPoolQuery<GuildRow>(deps.pool, guildDetail(), { guildId });
  if (!row) throw new NotFoundError('That guild does not exist.');
  const { memberCount, ...guild } = row;
  return { ...guildDto(buildFromRow(Guild, guild), myRole), memberCount };
}

export async function updateGuild(
  deps: Pick<AppDeps, 'sequelize' | 'pool'>,
  guildId: number,
  myRole: Role,
  input: UpdateGuildInput,
) {
  const guild = await Guild.findByPk(guildId);
  if (!guild) throw new NotFoundError('That guild does not exist.');
  const { dues, currency, ...rest } = input;
  if (currency && currency !== guild.currency) {
    const charged = await deps.sequelize.query<{ n: number }>(PAYMENT_COUNT, {
      bind: { guildId },
      type: QueryTypes.SELECT,
    });
    if ((charged[0]?.n ?? 0) > 0) {
      throw new ValidationError('The currency cannot change once members have paid in it.', {
        currency: 'The currency cannot change once members have paid in it.',
      });
    }
  }
  await guild.update({
    ...rest,
    ...(currency ? { currency } : {}),
    ...(dues !== undefined ? { duesAmount: dues?.amount ?? null, duesYear: dues?.year ?? null } : {}),
  });
  return getGuild(deps, guildId, myRole);
}

/** The guild's active members by name, in one statement. */
export async function listMembers(deps: Pick<AppDeps, 'pool'>, guildId: number): Promise<MemberDto[]> {
  const rows = await preparedPoolQuery<Omit<MemberDto, 'joinedAt'> & { joinedAt: Date }>(deps.pool, MEMBER_LIST, { guildId });
  return rows.map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() }));
}

async function assertNotLastAdmin(guildId: number, userId: number, transaction: Transaction) {
  const admins = await Membership.findAll({
    where: { guildId, role: 'admin', status: 'active' },
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (admins.length === 1 && admins[0]!.userId === userId) {
    throw new ConflictError('A guild needs at least one admin. Make someone else admin first.', 'last_admin');
  }
}

export async function changeRole(
  deps: Pick<AppDeps, 'events' | 'sequelize' | 'pool'>,
  guildId: number,
  userId: number,
  role: Role,
) {
  await deps.sequelize.transaction(async (transaction) => {
    const membership = await Membership.findOne({ where: { guildId, userId, status: 'active' }, transaction });
    if (!membership) throw new NotFoundError('That person is not a member of this guild.');
    if (membership.role === 'admin' && role !== 'admin') await assertNotLastAdmin(guildId, userId, transaction);
    await membership.update({ role }, { transaction });
  });
  return (await listMembers(deps, guildId)).find((m) => m.userId === userId)!;
}

export async function removeMember(deps: Pick<AppDeps, 'events' | 'sequelize'>, guildId: number, userId: number) {
  await deps.sequelize.transaction(async (transaction) => {
    const membership = await Membership.findOne({ where: { guildId, userId, status: 'active' }, transaction });
    if (!membership) throw new NotFoundError('That person is not a member of this guild.');
    if (membership.role === 'admin') await assertNotLastAdmin(guildId, userId, transaction);
    await membership.update({ status: 'removed' }, { transaction });
  });
  deps.events.emit('member.removed', { guildId, userId });
}

export async function listInvitations(guildId: number): Promise<InvitationDto[]> {
  const invitations = await Invitation.findAll({
    where: { guildId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    order: [['createdAt', 'DESC']],
  });
  return invitations.map(invitationDto);
}

function invitationDto(i: Invitation): InvitationDto {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    open: i.open,
    expiresAt: i.expiresAt.toISOString(),
    acceptedAt: i.acceptedAt?.toISOString() ?? null,
  };
}

const DAY_MS = 86_400_000;

async function sentSince(where: { guildId?: number; invitedById?: number }, transaction?: Transaction) {
  return Invitation.count({ where: { ...where, createdAt: { [Op.gt]: new Date(Date.now() - DAY_MS) } }, transaction });
}

/** The invitation allowances of the last 24 hours, for the caller and for the guild. */
export async function invitationLimits(
  deps: Pick<AppDeps, 'config'>,
  guildId: number,
  userId: number,
  transaction?: Transaction,
): Promise<InvitationLimitsDto> {
  const perInviterDay = deps.config.INVITES_PER_INVITER_DAY;
  const perGuildDay = deps.config.INVITES_PER_GUILD_DAY;
  const sentByYouToday = await sentSince({ invitedById: userId }, transaction);
  const sentByGuildToday = await sentSince({ guildId }, transaction);
  const remaining = Math.max(0, Math.min(perInviterDay - sentByYouToday, perGuildDay - sentByGuildToday));
  return { perInviterDay, perGuildDay, sentByYouToday, sentByGuildToday, remaining, validDays: INVITATION_VALID_DAYS };
}

/**
 * Records an invitation and e-mails its link; only the token's hash is kept. Invitations are
 * rationed per inviter (across guilds) and per guild over 24 hours, and an address with an open
 * invitation to the guild gets no second one, so nobody can use the guild to send mail in bulk.
 */
export async function invite(
  deps: Pick<AppDeps, 'mailer' | 'config' | 'logger' | 'sequelize'>,
  opts: { guildId: number; inviter: Express.User; inviterRole: Role; email: string; role: Role; open?: boolean },
): Promise<InvitationDto> {
  if (opts.role !== 'member' && !can(opts.inviterRole, 'invitations:create-officer')) {
    throw new ForbiddenError('Only a guild admin can invite admins or coordinators.');
  }
  if (opts.open && !can(opts.inviterRole, 'invitations:create-officer')) {
    throw new ForbiddenError('Only a guild admin can make an open link that anyone may use.');
  }
  const guild = await Guild.findByPk(opts.guildId);
  if (!guild) throw new NotFoundError('That guild does not exist.');
  const existing = await Membership.findOne({
    where: { guildId: opts.guildId, status: 'active' },
    include: [{ model: User, as: 'user', where: { email: opts.email }, attributes: ['id'] }],
  });
  if (existing) throw new ConflictError('That person is already a member of this guild.', 'already_member');

  const { token, tokenHash } = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_VALID_DAYS * DAY_MS);
  const invitation = await deps.sequelize.transaction(async (transaction) => {
    // One invitation at a time per guild and per inviter, so the counts below cannot be raced past.
    await deps.sequelize.query(LOCK_INVITATIONS, {
      bind: { guildKey: `invite:guild:${opts.guildId}`, inviterKey: `invite:user:${opts.inviter.id}` },
      transaction,
    });
    const pending = await Invitation.findOne({
      where: { guildId: opts.guildId, email: opts.email, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
      transaction,
    });
    if (pending) {
      throw new ConflictError(
        `${opts.email} already has an invitation waiting, valid until ${pending.expiresAt.toISOString().slice(0, 10)}. Withdraw it first to send a new one.`,
        'invitation_pending',
      );
    }
    const limits = await invitationLimits(deps, opts.guildId, opts.inviter.id, transaction);
    if (limits.sentByYouToday >= limits.perInviterDay) {
      throw new AppError(
        429,
        'invitation_limit',
        `You have sent ${limits.perInviterDay} invitations in the last 24 hours, the most allowed. Try again tomorrow.`,
      );
    }
    if (limits.sentByGuildToday >= limits.perGuildDay) {
      throw new AppError(
        429,
        'invitation_limit',
        `This guild has sent ${limits.perGuildDay} invitations in the last 24 hours, the most allowed. Try again tomorrow.`,
      );
    }
    return Invitation.create(
      {
        guildId: opts.guildId,
        email: opts.email,
        role: opts.role,
        open: opts.open ?? false,
        tokenHash,
        invitedById: opts.inviter.id,
        expiresAt,
      },
      { transaction },
    );
  });
  const url = `${deps.config.PUBLIC_URL}/invitations/${encodeURIComponent(token)}`;
  await deps.mailer.send(
    invitationMail({
      to: opts.email,
      guildName: guild.name,
      inviterName: opts.inviter.displayName,
      role: opts.role,
      url,
      expiresAt,
    }),
  );
  return invitationDto(invitation);
}

export async function revokeInvitation(guildId: number, invitationId: number) {
  const removed = await Invitation.destroy({ where: { id: invitationId, guildId, acceptedAt: null } });
  if (!removed) throw new NotFoundError('That invitation is not open any more.');
}

async function findOpenInvitation(token: string) {
  const invitation = await Invitation.findOne({
    where: { tokenHash: hashToken(token) },
    include: [{ model: Guild, as: 'guild' }],
  });
  if (!invitation) throw new NotFoundError('This invitation link is not valid. Ask the guild for a new one.');
  if (invitation.acceptedAt) throw new ConflictError('This invitation was already accepted.', 'invitation_used');
  if (invitation.expiresAt.getTime() < Date.now()) {
    throw new ValidationError('This invitation has expired. Ask the guild for a new one.', { token: 'expired' });
  }
  return invitation;
}

export async function previewInvitation(token: string): Promise<InvitationPreviewDto> {
  const invitation = await findOpenInvitation(token);
  return {
    guildName: invitation.guild!.name,
    email: invitation.email,
    role: invitation.role,
    open: invitation.open,
    expiresAt: invitation.expiresAt.toISOString(),
  };
}

/**
 * The signed-in user joins with the invited role; a removed member comes back. Only the account
 * with the invited address may accept, unless an admin made the link open; a name another member
 * of the guild already goes by is refused with a suggestion.
 */
export async function acceptInvitation(deps: Pick<AppDeps, 'events' | 'sequelize'>, token: string, user: Express.User) {
  const userId = user.id;
  const invitation = await findOpenInvitation(token);
  if (!invitation.open && invitation.email !== user.email) {
    throw new AppError(
      403,
      'invitation_other_address',
      `This invitation was sent to ${invitation.email}. Sign in with the account for that address to accept it, or ask the guild to invite ${user.email}.`,
    );
  }
  await assertNameFreeInGuilds(userId, user.displayName, [invitation.guildId], user.email);
  const membership = await deps.sequelize.transaction(async (transaction) => {
    const [spent] = await Invitation.update(
      { acceptedAt: new Date(), acceptedById: userId },
      { where: { id: invitation.id, acceptedAt: null }, transaction },
    );
    if (spent !== 1) throw new ConflictError('This invitation was already accepted.', 'invitation_used');
    const existing = await Membership.findOne({ where: { guildId: invitation.guildId, userId }, transaction });
    if (existing?.status === 'active') return existing;
    if (existing) return existing.update({ status: 'active', role: invitation.role }, { transaction });
    return Membership.create({ guildId: invitation.guildId, userId, role: invitation.role }, { transaction });
  });
  deps.events.emit('member.joined', { guildId: membership.guildId, userId, role: membership.role });
  return { guildId: membership.guildId, guildName: invitation.guild!.name, role: membership.role };
}
