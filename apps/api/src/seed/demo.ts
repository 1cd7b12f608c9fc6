// The whole demo seed: the scenario (practices, people, catalogue, implants, restorations,
// torque) and the history each feature adds on top of it, in one transaction of the caller.
import type { Tx } from '../db/database.js';
import { seedDemoScenario, type SeedSummary } from './demo-scenario.js';
import { seedDemoRecallHistory } from './demo-recall-history.js';
import { seedLedgerHistory } from './demo-ledger-history.js';
import { seedAuditHistory } from './demo-audit-history.js';
import { seedDemoPeople } from './demo-people.js';
import { seedDemoRadiographs, type SeedStorage } from './demo-radiographs.js';
import { seedDigitalImpression } from './demo-digital-impression.js';

/** `storage` receives the radiograph files (objects first: the rows are written after them). */
export async function seedDemo(tx: Tx, today: string, storage: SeedStorage): Promise<SeedSummary> {
  const { summary, refs } = await seedDemoScenario(tx, today);
  // Feature seeds (ledger history, recall history) are added here, each in a file of its own.
  await seedDemoRecallHistory(tx, refs);
  await seedLedgerHistory(tx, refs);
  await seedDemoPeople(tx, refs);
  // Radiographs after the recalls: their bone levels are read from the recall exams seeded above.
  await seedDemoRadiographs(tx, refs, storage);
  await seedDigitalImpression(tx, refs, storage);
  // Last: the audit trail follows the clinical history the seeds above wrote.
  await seedAuditHistory(tx, refs);
  return summary;
}
