import { Module } from '@nestjs/common';
import { LabPrescriptionsController } from './lab-prescriptions.controller.js';
import { LabPrescriptionsService } from './lab-prescriptions.service.js';

@Module({ controllers: [LabPrescriptionsController], providers: [LabPrescriptionsService] })
export class LabPrescriptionsModule {}
