import { Module } from '@nestjs/common';
import { ImportProgressStore } from './import-progress.js';
import { ImportsController } from './imports.controller.js';
import { ImportsService } from './imports.service.js';

@Module({
  controllers: [ImportsController],
  providers: [ImportsService, ImportProgressStore],
})
export class ImportsModule {}
