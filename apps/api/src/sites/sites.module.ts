import { Module } from '@nestjs/common';
import { InsertChangesModule } from '../insert-changes/insert-changes.module.js';
import { RecallsModule } from '../recalls/recalls.module.js';
import { SitesController } from './sites.controller.js';
import { SitesService } from './sites.service.js';

// The maintenance status of each site comes from RecallsModule (MaintenanceStatusService), its
// insert changes from InsertChangesModule.
@Module({ imports: [RecallsModule, InsertChangesModule], controllers: [SitesController], providers: [SitesService] })
export class SitesModule {}
