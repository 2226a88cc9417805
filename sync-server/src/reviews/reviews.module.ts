import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { MailModule } from '../mail/mail.module.js';
import { MapsModule } from '../maps/maps.module.js';
import { Membership } from '../memberships/models/membership.model.js';
import { SpotChecksModule } from '../spot-checks/spot-checks.module.js';
import { ReviewsController } from './reviews.controller.js';
import { ReviewsService } from './reviews.service.js';

@Module({
  imports: [MapsModule, MailModule, SpotChecksModule, SequelizeModule.forFeature([Membership])],
  controllers: [ReviewsController],
  providers: [ReviewsService],
})
export class ReviewsModule {}
