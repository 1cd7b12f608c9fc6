import { Module } from '@nestjs/common';
import { BoneLevelsController } from './bone-levels.controller.js';
import { BoneLevelsService } from './bone-levels.service.js';
import { RadiographsController } from './radiographs.controller.js';
import { RadiographPreviewService } from './radiograph-previews.service.js';
import { RadiographUploadService } from './radiograph-upload.service.js';
import { RadiographsService } from './radiographs.service.js';

// BoneLevelsService is exported for the recall exam form, which offers the latest measured bone level.
@Module({
  controllers: [RadiographsController, BoneLevelsController],
  providers: [RadiographsService, BoneLevelsService, RadiographUploadService, RadiographPreviewService],
  exports: [BoneLevelsService],
})
export class RadiographsModule {}
