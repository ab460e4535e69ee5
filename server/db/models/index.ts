import type { Sequelize } from 'sequelize';
import { User } from './user';
import { Guild } from './guild';
import { Membership } from './membership';
import { Invitation } from './invitation';
import { PasswordReset } from './password-reset';

export { User, Guild, Membership, Invitation, PasswordReset };

let initialised: Sequelize | null = null;

/**
 * Binds every model to one Sequelize instance. Sequelize models are module-level classes, so a
 * process works with one database at a time (tests get one database per test file).
 */
export function initModels(sequelize: Sequelize) {
  if (initialised === sequelize) return;
  initialised = sequelize;
  for (const model of [User, Guild, Membership, Invitation, PasswordReset]) model.initModel(sequelize);

  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Guild.hasMany(Membership, { foreignKey: 'guildId', as: 'memberships' });
  Membership.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  Invitation.belongsTo(Guild, { foreignKey: 'guildId', as: 'guild' });
  Invitation.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId', as: 'user' });

  // Feature models (server/db/models/<feature>.ts) are initialised below, after the core ones.
}
