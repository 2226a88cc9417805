import type { ModelCtor } from 'sequelize-typescript';
import { PasswordReset } from '../auth/models/password-reset.model.js';
import { RefreshToken } from '../auth/models/refresh-token.model.js';
import { MailMessage } from '../mail/models/mail-message.model.js';
import { Invitation } from '../memberships/models/invitation.model.js';
import { Membership } from '../memberships/models/membership.model.js';
import { Project } from '../projects/models/project.model.js';
import { User } from '../users/models/user.model.js';

/** The models of accounts, projects, memberships and mail (tables from db/migrations 0002–0004). */
export const ACCOUNT_MODELS: readonly ModelCtor[] = [User, RefreshToken, PasswordReset, Project, Membership, Invitation, MailMessage];
