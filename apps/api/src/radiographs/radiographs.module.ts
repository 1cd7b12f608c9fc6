import { Module } from '@nestjs/common';
import { RadiographsController } from './radiographs.controller.js';
import { RadiographsService } from './radiographs.service.js';

@Module({ controllers: [RadiographsController], providers: [RadiographsService] })
export class RadiographsModule {}
