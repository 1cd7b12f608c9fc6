import { Module } from '@nestjs/common';
import { RadiographsController } from './radiographs.controller.js';
import { RadiographPreviewService } from './radiograph-previews.service.js';
import { RadiographUploadService } from './radiograph-upload.service.js';
import { RadiographsService } from './radiographs.service.js';
import { RadiographStreamSlots } from './stream-slots.js';

@Module({
  controllers: [RadiographsController],
  providers: [RadiographsService, RadiographUploadService, RadiographPreviewService, RadiographStreamSlots],
})
export class RadiographsModule {}
