import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { MapsModule } from '../maps/maps.module.js';
import { Membership } from '../memberships/models/membership.model.js';
import { ExportsController } from './exports.controller.js';
import { ExportsService } from './exports.service.js';

@Module({
  imports: [MapsModule, SequelizeModule.forFeature([Membership])],
  controllers: [ExportsController],
  providers: [ExportsService],
})
export class ExportsModule {}
