import { Module } from '@nestjs/common';
import { PassportMailService } from './passport-mail.service.js';
import { RecordsOutController } from './records-out.controller.js';
import { RecordsOutService } from './records-out.service.js';

// Records that leave the practice: the FHIR export, the implant passport and the retrieval card.
@Module({
  controllers: [RecordsOutController],
  providers: [RecordsOutService, PassportMailService],
})
export class RecordsOutModule {}
