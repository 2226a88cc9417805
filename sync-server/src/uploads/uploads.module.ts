import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { MulterModule } from '@nestjs/platform-express';
import { SequelizeModule } from '@nestjs/sequelize';
import { MapsModule } from '../maps/maps.module.js';
import { Membership } from '../memberships/models/membership.model.js';
import { syncConfigProvider } from '../sync/sync-config.js';
import { UploadTooLargeFilter } from './upload-too-large.filter.js';
import { UploadsController } from './uploads.controller.js';
import { UploadsService } from './uploads.service.js';

@Module({
  imports: [
    MapsModule,
    SequelizeModule.forFeature([Membership]),
    // Files stay in memory (bounded by the limit) until checked, then go to MariaDB in one insert.
    MulterModule.registerAsync({
      inject: [ConfigService],
      useFactory: (cs: ConfigService) => ({ limits: { fileSize: syncConfigProvider.useFactory(cs).uploads.maxBytes, files: 1, fields: 10 } }),
    }),
  ],
  controllers: [UploadsController],
  providers: [syncConfigProvider, UploadsService, UploadTooLargeFilter],
})
export class UploadsModule {}
