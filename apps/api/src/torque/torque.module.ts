import { Module } from '@nestjs/common';
import { SeatRestorationController } from './seat-restoration.controller.js';
import { SeatRestorationService } from './seat-restoration.service.js';
import { TorqueController } from './torque.controller.js';
import { TorqueService } from './torque.service.js';

@Module({
  controllers: [TorqueController, SeatRestorationController],
  providers: [TorqueService, SeatRestorationService],
})
export class TorqueModule {}
