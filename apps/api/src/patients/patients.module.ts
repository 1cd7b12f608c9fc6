import { Module } from '@nestjs/common';
import { RecallsModule } from '../recalls/recalls.module.js';
import { PatientsController } from './patients.controller.js';
import { PatientsService } from './patients.service.js';

// The maintenance status of each site comes from RecallsModule (MaintenanceStatusService).
@Module({ imports: [RecallsModule], controllers: [PatientsController], providers: [PatientsService] })
export class PatientsModule {}
