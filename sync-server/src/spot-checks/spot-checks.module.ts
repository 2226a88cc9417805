import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { MapsModule } from '../maps/maps.module.js';
import { Membership } from '../memberships/models/membership.model.js';
import { syncConfigProvider } from '../sync/sync-config.js';
import { SpotChecksController } from './spot-checks.controller.js';
import { SpotChecksService } from './spot-checks.service.js';

@Module({
  imports: [MapsModule, SequelizeModule.forFeature([Membership])],
  controllers: [SpotChecksController],
  providers: [syncConfigProvider, SpotChecksService],
  exports: [SpotChecksService],
})
export class SpotChecksModule {}
