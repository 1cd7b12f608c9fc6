import { Module } from '@nestjs/common';
import { ImpressionsController } from './impressions.controller.js';
import { ImpressionsService } from './impressions.service.js';
import { ScanFilesController } from './scan-files.controller.js';
import { ScanFilesService } from './scan-files.service.js';

@Module({
  controllers: [ImpressionsController, ScanFilesController],
  providers: [ImpressionsService, ScanFilesService],
})
export class ImpressionsModule {}
