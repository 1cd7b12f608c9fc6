import { Module } from '@nestjs/common';
import { RadiographsModule } from '../radiographs/radiographs.module.js';
import { DeskService } from './desk.service.js';
import { ExamsService } from './exams.service.js';
import { MaintenanceStatusService } from './maintenance-status.service.js';
import { RecallAdminController } from './recall-admin.controller.js';
import { RecallClock } from './recall-clock.js';
import { RecallScheduler } from './recall-scheduler.service.js';
import { RecallsController } from './recalls.controller.js';
import { RemindersService } from './reminders.service.js';

// RadiographsModule: the exam form offers each site's latest measured bone level.
@Module({
  imports: [RadiographsModule],
  controllers: [RecallsController, RecallAdminController],
  providers: [RecallClock, RecallScheduler, DeskService, ExamsService, RemindersService, MaintenanceStatusService],
  // RecallScheduler: the legacy import schedules recalls after imported exams by the same rule.
  exports: [RecallClock, RecallScheduler, RemindersService, MaintenanceStatusService],
})
export class RecallsModule {}
