import type { Sequelize } from 'sequelize';
import { User } from './user';
import { Guild } from './guild';
import { Membership } from './membership';
import { Invitation } from './invitation';
import { PasswordReset } from './password-reset';
import { PendingSignup } from './pending-signup';
import { Photo } from './photo';
import { Swap } from './swap';
import { SwapTransition } from './swap-transition';
import { Signup } from './signup';
import { Block } from './block';
import { Measurement } from './measurement';
import { BlockRequest } from './block-request';
import { MailMessage } from './mail-message';
import { MailPreference } from './mail-preference';
import { SewDay } from './sew-day';
import { Rsvp } from './rsvp';
import { ChatRoom } from './chat-room';
import { ChatMessage } from './chat-message';
import { Activity } from './activity';
import { PhotoEstimate } from './photo-estimate';

export { User, Guild, Membership, Invitation, PasswordReset, PendingSignup };
export { Photo };
export { Swap, SwapTransition, Signup, Block, Measurement, BlockRequest };
export { MailMessage, MailPreference };
export { SewDay, Rsvp, ChatRoom, ChatMessage, Activity };
export { PhotoEstimate };

let initialised: Sequelize | null = null;

/**
 * Binds every model to one Sequelize instance. Sequelize models are module-level classes, so a
 * process works with one database at a time (tests get one database per test file).
 */
export function initModels(sequelize: Sequelize) {
  if (initialised === sequelize) return;
  initialised = sequelize;
  for (const model of [User, Guild, Membership, Invitation, PasswordReset, PendingSignup]) model.initModel(sequelize);

  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Guild.hasMany(Membership, { foreignKey: 'guildId', as: 'memberships' });
  Membership.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  Invitation.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  Invitation.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId', as: 'user' });

  // Feature models (server/db/models/<feature>.ts) are initialised below, after the core ones.

  for (const model of [Swap, SwapTransition, Signup, Block, Measurement, BlockRequest]) model.initModel(sequelize);
  Swap.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  Swap.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
  SwapTransition.belongsTo(User, { foreignKey: 'byId', as: 'by' });
  Signup.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Swap.hasMany(Signup, { foreignKey: 'swapId', as: 'signups' });
  Swap.hasMany(Block, { foreignKey: 'swapId', as: 'blocks' });
  Block.belongsTo(Swap, { foreignKey: 'swapId', as: 'swap' });
  Block.belongsTo(User, { foreignKey: 'makerId', as: 'maker' });
  Block.belongsTo(User, { foreignKey: 'recipientId', as: 'recipient' });
  Block.hasMany(Measurement, { foreignKey: 'blockId', as: 'measurements' });
  Measurement.belongsTo(User, { foreignKey: 'measuredById', as: 'measuredBy' });
  BlockRequest.belongsTo(Block, { foreignKey: 'blockId', as: 'block' });

  for (const model of [MailMessage, MailPreference]) model.initModel(sequelize);
  MailMessage.belongsTo(User, { foreignKey: 'userId', as: 'user', constraints: false });

  Photo.initModel(sequelize);
  Photo.belongsTo(User, { foreignKey: 'uploadedById', as: 'uploadedBy' });

  PhotoEstimate.initModel(sequelize);
  PhotoEstimate.belongsTo(User, { foreignKey: 'measuredById', as: 'measuredBy' });

  for (const model of [SewDay, Rsvp, ChatRoom, ChatMessage, Activity]) model.initModel(sequelize);
  SewDay.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  SewDay.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
  SewDay.hasMany(Rsvp, { foreignKey: 'sewDayId', as: 'rsvps' });
  Rsvp.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  ChatRoom.belongsTo(SewDay, { foreignKey: 'sewDayId', as: 'sewDay' });
  ChatRoom.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  ChatMessage.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
  ChatMessage.belongsTo(User, { foreignKey: 'deletedById', as: 'deletedBy' });
}
