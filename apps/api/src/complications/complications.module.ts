import { Module } from '@nestjs/common';
import { ComplicationsController } from './complications.controller.js';
import { ComplicationsService } from './complications.service.js';

@Module({ controllers: [ComplicationsController], providers: [ComplicationsService] })
export class ComplicationsModule {}
