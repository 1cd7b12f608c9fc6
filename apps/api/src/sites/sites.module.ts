import { Module } from '@nestjs/common';
import { RecallsModule } from '../recalls/recalls.module.js';
import { SitesController } from './sites.controller.js';
import { SitesService } from './sites.service.js';

// The maintenance status of each site comes from RecallsModule (MaintenanceStatusService).
@Module({ imports: [RecallsModule], controllers: [SitesController], providers: [SitesService] })
export class SitesModule {}
