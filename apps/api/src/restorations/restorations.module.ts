import { Module } from '@nestjs/common';
import { RestorationsController } from './restorations.controller.js';
import { RestorationsService } from './restorations.service.js';

@Module({ controllers: [RestorationsController], providers: [RestorationsService], exports: [RestorationsService] })
export class RestorationsModule {}
