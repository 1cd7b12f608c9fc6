import { Module } from '@nestjs/common';
import { PeopleModule } from '../people/people.module.js';
import { ShareMailService } from './share-mail.service.js';
import { SharesController } from './shares.controller.js';
import { SharesService } from './shares.service.js';

/** Shares of a practice's patients with referring surgeons of other practices (issue 12). */
@Module({
  imports: [PeopleModule],
  controllers: [SharesController],
  providers: [SharesService, ShareMailService],
})
export class SharesModule {}
