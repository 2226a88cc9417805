import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { AuthModule } from '../auth/auth.module.js';
import { MailModule } from '../mail/mail.module.js';
import { Project } from '../projects/models/project.model.js';
import { User } from '../users/models/user.model.js';
import { UsersModule } from '../users/users.module.js';
import { InvitationLinksController } from './invitation-links.controller.js';
import { InvitationsService } from './invitations.service.js';
import { MembershipsController } from './memberships.controller.js';
import { MembershipsService } from './memberships.service.js';
import { Invitation } from './models/invitation.model.js';
import { Membership } from './models/membership.model.js';

@Module({
  imports: [AuthModule, UsersModule, MailModule, SequelizeModule.forFeature([Membership, Invitation, Project, User])],
  controllers: [MembershipsController, InvitationLinksController],
  providers: [MembershipsService, InvitationsService],
})
export class MembershipsModule {}
