import { Module } from '@nestjs/common';
import { TorqueController } from './torque.controller.js';
import { TorqueService } from './torque.service.js';

@Module({ controllers: [TorqueController], providers: [TorqueService] })
export class TorqueModule {}
