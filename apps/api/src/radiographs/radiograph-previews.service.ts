// Previews off the request path: an upload answers as soon as its row commits, with the preview
// pending; a job of the API's queue then reads the stored object as a stream, makes the PNG
// preview and thumbnail in bounded memory (preview.ts) and marks the row ready — or unavailable
// with the reason. Storage failing is retried with exponential back-off, each failed attempt
// counted on the row; after the last retry the preview is unavailable and says why. One job per
// radiograph (the queue's singleton key), one at a time per API process (the queue's worker takes
// one job), so previews never add up in memory. A sweep every minute queues a job for any
// radiograph still pending without one (queue not running at upload, rows written by the seed).
import { Inject, Injectable, Logger } from '@nestjs/common';
import { ENV, type Env } from '../config/env.js';
import { DB, type Database } from '../db/database.js';
import { JobsService } from '../jobs/jobs.service.js';
import { StorageService } from '../storage/storage.service.js';
import { tooLargeProblem } from './dicom-pixels.js';
import { makePreviews } from './preview.js';
import * as repo from './radiographs.repository.js';
import { StreamSlots } from '../storage/stream-slots.js';

const PREVIEW_QUEUE = 'radiograph-preview';
const SWEEP_QUEUE = 'radiograph-preview-sweep';
const SWEEP_BATCH = 200;

interface PreviewJob {
  radiographId: string;
}

export type PreviewOutcome = 'ready' | 'unavailable' | 'retry' | 'not-pending';

/** The keys of a radiograph's server-made images beside its original. */
export const previewKey = (objectKey: string, which: 'preview' | 'thumbnail') => `${objectKey}.${which}.png`;

const clientStatus = (error: unknown) => {
  const status = (error as { $metadata?: { httpStatusCode?: number } } | null)?.$metadata?.httpStatusCode;
  return typeof status === 'number' && status < 500 ? status : null;
};

@Injectable()
export class RadiographPreviewService {
  private readonly logger = new Logger('RadiographPreviews');

  constructor(
    @Inject(ENV) private readonly env: Env,
    @Inject(DB) private readonly db: Database,
    private readonly jobs: JobsService,
    private readonly storage: StorageService,
    private readonly slots: StreamSlots,
  ) {
    jobs.register<PreviewJob>({
      name: PREVIEW_QUEUE,
      policy: 'exclusive',
      retryLimit: env.RADIOGRAPH_PREVIEW_RETRY_LIMIT,
      retryDelay: env.RADIOGRAPH_PREVIEW_RETRY_DELAY_S,
      pollingIntervalSeconds: 1,
      handle: async ({ radiographId }, { finalAttempt }) => {
        if ((await this.make(radiographId, finalAttempt)) === 'retry')
          throw new Error(`preview of radiograph ${radiographId} not made; will retry`);
      },
    });
    jobs.register<object>({
      name: SWEEP_QUEUE,
      policy: 'standard',
      retryLimit: 0,
      retryDelay: 60,
      cron: '* * * * *',
      handle: () => this.sweep(),
    });
  }

  /** Queues the preview of a radiograph whose row has committed; the sweep catches a failed send. */
  async queue(radiographId: string): Promise<void> {
    try {
      await this.jobs.send(PREVIEW_QUEUE, { radiographId } satisfies PreviewJob, radiographId);
    } catch (error) {
      this.logger.warn(`preview of radiograph ${radiographId} not queued yet: ${String(error)}`);
    }
  }

  /** Queues a job for every radiograph still pending (the singleton key skips those already queued). */
  async sweep(): Promise<void> {
    for (const id of await repo.listPendingPreviews(this.db, SWEEP_BATCH))
      await this.jobs.send(PREVIEW_QUEUE, { radiographId: id } satisfies PreviewJob, id);
  }

  /**
   * Makes the preview and thumbnail of one pending radiograph. A problem of the file itself ends
   * the preview as unavailable at once; storage failing is 'retry' until the final attempt.
   */
  async make(radiographId: string, finalAttempt = false): Promise<PreviewOutcome> {
    const r = await repo.previewTarget(this.db, radiographId);
    if (!r || r.previewStatus !== 'pending') return 'not-pending';
    const maxPixels = this.env.RADIOGRAPH_PREVIEW_MAX_PIXELS;
    const unavailable = async (problem: string) => {
      await repo.finishPreview(this.db, r.id, { ready: false, problem });
      return 'unavailable' as const;
    };
    if (r.rows && r.columns && r.rows * r.columns > maxPixels) {
      return unavailable(tooLargeProblem(maxPixels, { width: r.columns, height: r.rows }));
    }
    // The decoding shares the uploads' slots, so previews made during uploads add no memory.
    const release = await this.slots.acquire();
    try {
      const made = await makePreviews(r.fileType, await this.storage.getStream(r.objectKey), { maxPixels });
      if (!made.ok) return await unavailable(made.problem);
      await this.storage.put(previewKey(r.objectKey, 'preview'), made.preview, 'image/png');
      await this.storage.put(previewKey(r.objectKey, 'thumbnail'), made.thumbnail, 'image/png');
      await repo.finishPreview(this.db, r.id, { ready: true, rows: made.height, columns: made.width });
      return 'ready';
    } catch (error) {
      const status = clientStatus(error);
      if (status !== null) {
        return unavailable(`preview not available: the stored file cannot be read (storage answered ${status})`);
      }
      this.logger.warn(
        `preview of radiograph ${r.id} failed: ${error instanceof Error ? error.message : String(error)}`,
      );
      await repo.countPreviewAttempt(this.db, r.id);
      if (!finalAttempt) return 'retry';
      return unavailable(
        `preview not available: file storage could not be read after ${this.env.RADIOGRAPH_PREVIEW_RETRY_LIMIT + 1} attempts`,
      );
    } finally {
      release();
    }
  }
}
