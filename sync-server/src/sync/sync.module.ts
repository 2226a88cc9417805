import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { MapsModule } from '../maps/maps.module.js';
import { Membership } from '../memberships/models/membership.model.js';
import { syncConfigProvider } from './sync-config.js';
import { SyncController } from './sync.controller.js';
import { SyncService } from './sync.service.js';

@Module({
  imports: [MapsModule, SequelizeModule.forFeature([Membership])],
  controllers: [SyncController],
  providers: [syncConfigProvider, SyncService],
})
export class SyncModule {}
