import { Injectable } from '@nestjs/common';
import type { ImportProgress } from '@torquetrail/contracts';

interface Run {
  userId: string;
  progress: ImportProgress;
  touchedAt: number;
}

/** How long a finished run's progress stays readable. */
const KEEP_MS = 10 * 60_000;

/**
 * The progress of the dry runs and imports this API process is running, for the page to poll
 * while its request runs (docs/import.md). In memory: behind several API instances a poll may
 * reach another one and find nothing, which only leaves the bar empty.
 */
@Injectable()
export class ImportProgressStore {
  private readonly runs = new Map<string, Run>();

  start(runId: string, userId: string): ImportProgress {
    this.sweep();
    const progress: ImportProgress = {
      runId,
      phase: 'reading',
      rowsRead: 0,
      rowsWritten: 0,
      recordsToWrite: null,
      totalRows: null,
    };
    this.runs.set(runId, { userId, progress, touchedAt: Date.now() });
    return progress;
  }

  /** Only the user who started a run sees it; any other id is unknown. */
  get(runId: string, userId: string): ImportProgress | null {
    const run = this.runs.get(runId);
    return run && run.userId === userId ? run.progress : null;
  }

  touch(progress: ImportProgress) {
    const run = this.runs.get(progress.runId);
    if (run) run.touchedAt = Date.now();
  }

  private sweep() {
    const now = Date.now();
    for (const [id, run] of this.runs) if (now - run.touchedAt > KEEP_MS) this.runs.delete(id);
  }
}
