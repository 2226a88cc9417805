import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { AuthModule } from '../auth/auth.module.js';
import { Membership } from '../memberships/models/membership.model.js';
import { Project } from './models/project.model.js';
import { ProjectsController } from './projects.controller.js';
import { ProjectsService } from './projects.service.js';

@Module({
  imports: [AuthModule, SequelizeModule.forFeature([Project, Membership])],
  controllers: [ProjectsController],
  providers: [ProjectsService],
})
export class ProjectsModule {}
