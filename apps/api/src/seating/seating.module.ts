import { Module } from '@nestjs/common';
import { SeatingController } from './seating.controller.js';
import { SeatingService } from './seating.service.js';

@Module({ controllers: [SeatingController], providers: [SeatingService] })
export class SeatingModule {}
