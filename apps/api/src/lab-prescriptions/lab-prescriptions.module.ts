import { Module } from '@nestjs/common';
import { ImpressionsModule } from '../impressions/impressions.module.js';
import { RestorationsModule } from '../restorations/restorations.module.js';
import { LabPrescriptionsController } from './lab-prescriptions.controller.js';
import { LabMailService } from './lab-mail.service.js';
import { LabPrescriptionsService } from './lab-prescriptions.service.js';

// The restoration and its sites come from RestorationsService, the impression from
// ImpressionsService (each exported by its module).
@Module({
  imports: [RestorationsModule, ImpressionsModule],
  controllers: [LabPrescriptionsController],
  providers: [LabPrescriptionsService, LabMailService],
})
export class LabPrescriptionsModule {}
