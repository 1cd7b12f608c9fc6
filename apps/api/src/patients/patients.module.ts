import { Module } from '@nestjs/common';
import { RecallsModule } from '../recalls/recalls.module.js';
import { PatientRecordsService } from './patient-records.service.js';
import { PatientSettingsController } from './patient-settings.controller.js';
import { PatientsController } from './patients.controller.js';
import { PatientsService } from './patients.service.js';

// The maintenance status of each site and "today" (RecallClock) come from RecallsModule.
@Module({
  imports: [RecallsModule],
  controllers: [PatientsController, PatientSettingsController],
  providers: [PatientsService, PatientRecordsService],
})
export class PatientsModule {}
