import { Inject, Injectable } from '@nestjs/common';
import { DB, type Database } from '../db/database.js';
import { latestExamBySite } from './exams.repository.js';

/**
 * The maintenance status of implant sites (the latest current exam of each), for the Arch ring
 * and the Site file. Exported by RecallsModule so the patients and sites features ask the recall
 * feature rather than query its tables.
 */
@Injectable()
export class MaintenanceStatusService {
  constructor(@Inject(DB) private readonly db: Database) {}

  latestBySite(siteIds: string[]) {
    return latestExamBySite(this.db, siteIds);
  }
}
