import { Module } from '@nestjs/common';
import { RecallsModule } from '../recalls/recalls.module.js';
import { InsertChangesController } from './insert-changes.controller.js';
import { InsertChangesService } from './insert-changes.service.js';

// RecallsModule: "today" (RecallClock). InsertChangesService is exported for the Site file and Timeline.
@Module({
  imports: [RecallsModule],
  controllers: [InsertChangesController],
  providers: [InsertChangesService],
  exports: [InsertChangesService],
})
export class InsertChangesModule {}
