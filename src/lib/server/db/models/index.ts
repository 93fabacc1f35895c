import { Membership } from './membership';
import { Session } from './session';
import { User } from './user';
import { Workspace } from './workspace';

User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Workspace.hasMany(Membership, { foreignKey: 'workspaceId', as: 'memberships' });
Membership.belongsTo(Workspace, { foreignKey: 'workspaceId', as: 'workspace' });
User.hasMany(Session, { foreignKey: 'userId', as: 'sessions' });
Session.belongsTo(User, { foreignKey: 'userId', as: 'user' });

export { Membership, Session, User, Workspace };
export { ROLES, roleAtLeast, type Role } from './membership';
export { ApiToken } from './api-token';
export { MailMessage } from './mail-message';
export { Invite } from './invite';
export { CatalogueEntry } from './catalogue-entry';
export { Study } from './study';
export { Sweep, SWEEP_STATUSES, type SweepStatus } from './sweep';
export { ShareLink } from './share-link';
