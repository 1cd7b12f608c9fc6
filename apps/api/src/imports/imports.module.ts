import { Module } from '@nestjs/common';
import { RecallsModule } from '../recalls/recalls.module.js';
import { ImportProgressStore } from './import-progress.js';
import { ImportsController } from './imports.controller.js';
import { ImportsService } from './imports.service.js';

// RecallsModule: imported exams schedule the next recall by the app's rule.
@Module({
  imports: [RecallsModule],
  controllers: [ImportsController],
  providers: [ImportsService, ImportProgressStore],
})
export class ImportsModule {}
