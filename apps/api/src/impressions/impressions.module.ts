import { Module } from '@nestjs/common';
import { ImpressionsController } from './impressions.controller.js';
import { ImpressionsService } from './impressions.service.js';
import { ScanBodyMarkersController } from './scan-body-markers.controller.js';
import { ScanBodyMarkersService } from './scan-body-markers.service.js';
import { ScanFilesController } from './scan-files.controller.js';
import { ScanFilesService } from './scan-files.service.js';

@Module({
  controllers: [ImpressionsController, ScanFilesController, ScanBodyMarkersController],
  providers: [ImpressionsService, ScanFilesService, ScanBodyMarkersService],
  // The lab prescription names the impression, its scan bodies and scan files.
  exports: [ImpressionsService],
})
export class ImpressionsModule {}
