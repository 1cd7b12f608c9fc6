import { Module } from '@nestjs/common';
import { ImpressionsController } from './impressions.controller.js';
import { ImpressionsService } from './impressions.service.js';

@Module({ controllers: [ImpressionsController], providers: [ImpressionsService] })
export class ImpressionsModule {}
