// The whole demo seed: the scenario (practices, people, catalogue, implants, restorations,
// torque) and the history each feature adds on top of it, in one transaction of the caller.
import type { Tx } from '../db/database.js';
import { seedDemoScenario, type SeedSummary } from './demo-scenario.js';
import { seedDemoRecallHistory } from './demo-recall-history.js';
import { seedLedgerHistory } from './demo-ledger-history.js';
import { seedDemoPeople } from './demo-people.js';

export async function seedDemo(tx: Tx, today: string): Promise<SeedSummary> {
  const { summary, refs } = await seedDemoScenario(tx, today);
  // Feature seeds (ledger history, recall history) are added here, each in a file of its own.
  await seedDemoRecallHistory(tx, refs);
  await seedLedgerHistory(tx, refs);
  await seedDemoPeople(tx, refs);
  return summary;
}
