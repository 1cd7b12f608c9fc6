import type { Readable } from 'node:stream';
import {
  ConflictException,
  Inject,
  Injectable,
  NotFoundException,
  ServiceUnavailableException,
  UnprocessableEntityException,
} from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type {
  Measurement,
  MeasurementAmendmentBody,
  MeasurementBody,
  MeasurementPoints,
  Radiograph,
  RadiographDetail,
  RadiographUploadQuery,
} from '@torquetrail/contracts';
import { measureBoneLevels, RULES_VERSION, ValidationError } from '@torquetrail/domain';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, assertCanList, type Scope, sharedSitesOf } from '../authz/scope.js';
import { alreadyAmended } from '../common/amendment-conflict.js';
import { fieldError } from '../common/field-error.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { StorageService } from '../storage/storage.service.js';
import { CONTENT_TYPES } from './file-type.js';
import { previewKey, RadiographPreviewService } from './radiograph-previews.service.js';
import { RadiographUploadService } from './radiograph-upload.service.js';
import * as repo from './radiographs.repository.js';

type UploadQuery = z.output<typeof RadiographUploadQuery>;
type Points = z.output<typeof MeasurementPoints>;

const toRadiograph = (r: repo.RadiographRow): Radiograph => ({
  id: r.id,
  patientId: r.patientId,
  fileType: r.fileType,
  kind: r.kind,
  takenOn: r.takenOn,
  note: r.note,
  originalName: r.originalName,
  sizeBytes: r.sizeBytes,
  sha256: r.sha256,
  rows: r.rows,
  columns: r.columns,
  pixelSpacing: r.pixelSpacing,
  imagerPixelSpacing: r.imagerPixelSpacing,
  magnificationFactor: r.magnificationFactor,
  studyDate: r.studyDate,
  modality: r.modality,
  bitsStored: r.bitsStored,
  photometricInterpretation: r.photometricInterpretation,
  transferSyntaxUid: r.transferSyntaxUid,
  previewStatus: r.previewStatus,
  previewProblem: r.previewProblem,
  previewAttempts: r.previewAttempts,
  siteIds: r.siteIds,
  uploadedBy: r.uploadedByName,
  uploadedAt: r.uploadedAt.toISOString(),
  enteredInError:
    r.enteredInErrorAt && r.enteredInErrorReason
      ? { at: r.enteredInErrorAt.toISOString(), reason: r.enteredInErrorReason }
      : null,
});

const toMeasurement = (m: repo.MeasurementRow): Measurement => ({
  id: m.id,
  radiographId: m.radiographId,
  siteId: m.siteId,
  points: m.points as Points,
  implantTrueMm: m.implantTrueMm,
  mmPerUnit: m.mmPerUnit,
  mesialMm: m.mesialMm,
  distalMm: m.distalMm,
  spacingEstimate: (m.spacingEstimate as Measurement['spacingEstimate']) ?? null,
  rulesVersion: m.rulesVersion,
  measuredBy: m.measuredByName,
  measuredAt: m.measuredAt.toISOString(),
  supersedesId: m.supersedesId,
  amendmentReason: m.amendmentReason,
});

@Injectable()
export class RadiographsService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly storage: StorageService,
    private readonly uploads: RadiographUploadService,
    private readonly previews: RadiographPreviewService,
  ) {}

  /**
   * Upload: the file is streamed to S3 and its row written (radiograph-upload.service.ts); the
   * reply comes at once, with the preview pending until its job (radiograph-previews.service.ts)
   * has made it.
   */
  async upload(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    patientId: string,
    query: UploadQuery,
    body: Readable,
    declaredLength: number | undefined,
  ): Promise<Radiograph> {
    const id = await this.uploads.upload(ability, user, scope, patientId, query, body, declaredLength);
    const { measurements: _m, siteImplants: _s, ...radiograph } = await this.detail(ability, scope, id);
    // Queued after the reply is read, so the reply always says pending.
    await this.previews.queue(id);
    return radiograph;
  }

  async list(ability: AppAbility, scope: Scope, patientId: string, includeEnteredInError: boolean) {
    // Side by side: the list is scoped in its own where clause, so it is empty when the check fails.
    const [patient, rows] = await Promise.all([
      repo.findVisiblePatient(this.db, scope, patientId),
      repo.listForPatient(this.db, scope, patientId, includeEnteredInError, sharedSitesOf(scope, patientId)),
    ]);
    assertCanList(ability, scope, 'Radiograph', patient);
    return { items: rows.map(toRadiograph) };
  }

  async detail(ability: AppAbility, scope: Scope, id: string): Promise<RadiographDetail> {
    const r = assertCan(
      ability,
      'read',
      'Radiograph',
      await repo.findVisibleRadiograph(this.db, scope, id),
      'radiograph',
    );
    const measurements = await repo.currentMeasurements(this.db, r.id);
    const siteImplants = await Promise.all(
      r.siteIds.map(async (siteId) => ({ siteId, implantLengthMm: await repo.currentImplantLength(this.db, siteId) })),
    );
    return { ...toRadiograph(r), measurements: measurements.map(toMeasurement), siteImplants };
  }

  /** The stored original or one of its previews, streamed from S3 after the row check. */
  async file(ability: AppAbility, scope: Scope, id: string, which: 'original' | 'preview' | 'thumbnail') {
    const r = assertCan(
      ability,
      'read',
      'Radiograph',
      await repo.findVisibleRadiograph(this.db, scope, id),
      'radiograph',
    );
    if (which !== 'original' && r.previewStatus === 'unavailable') {
      throw new UnprocessableEntityException(r.previewProblem ?? 'preview not available');
    }
    if (which !== 'original' && r.previewStatus === 'pending') {
      throw new ConflictException('The preview is being prepared; try again in a few seconds');
    }
    const key = which === 'original' ? r.objectKey : previewKey(r.objectKey, which);
    try {
      const stream = await this.storage.getStream(key);
      const type = which === 'original' ? CONTENT_TYPES[r.fileType] : 'image/png';
      const extension = r.fileType === 'dicom' ? 'dcm' : r.fileType === 'jpeg' ? 'jpg' : 'png';
      return { stream, type, filename: `radiograph-${r.id}.${extension}` };
    } catch {
      throw new ServiceUnavailableException('Object storage is unavailable; try again in a few minutes');
    }
  }

  async markEnteredInError(ability: AppAbility, user: SessionUser, scope: Scope, id: string, reason: string) {
    const r = assertCan(
      ability,
      'amend',
      'Radiograph',
      await repo.findVisibleRadiograph(this.db, scope, id),
      'radiograph',
    );
    if (r.enteredInErrorAt) throw new ConflictException('This radiograph is already marked entered in error');
    await auditedTransaction(this.db, async (tx) => {
      await repo.markEnteredInError(tx, r.id, user.id, reason);
      reportChange({ type: 'Radiograph', id: r.id, patientId: r.patientId, after: { enteredInError: true, reason } });
    });
    const { measurements: _m, siteImplants: _s, ...rest } = await this.detail(ability, scope, id);
    return rest;
  }

  async measure(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    radiographId: string,
    body: z.output<typeof MeasurementBody>,
  ): Promise<Measurement> {
    const r = assertCan(
      ability,
      'create',
      'Radiograph',
      await repo.findVisibleRadiograph(this.db, scope, radiographId),
      'radiograph',
    );
    if (r.enteredInErrorAt) throw new ConflictException('This radiograph is marked entered in error');
    if (!r.siteIds.includes(body.siteId)) throw fieldError({ siteId: 'Choose one of the sites this radiograph shows' });
    const values = await this.compute(r, body.siteId, body.points, body.implantTrueMm);
    const row = {
      ...values,
      practiceId: r.practiceId,
      patientId: r.patientId,
      radiographId: r.id,
      siteId: body.siteId,
      measuredBy: user.id,
    };
    const id = await auditedTransaction(this.db, async (tx) => {
      const inserted = await repo.insertMeasurement(tx, row);
      reportChange({ type: 'RadiographMeasurement', id: inserted, patientId: r.patientId, after: row });
      return inserted;
    });
    return this.measurement(scope, id);
  }

  async amendMeasurement(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    measurementId: string,
    body: z.output<typeof MeasurementAmendmentBody>,
  ): Promise<Measurement> {
    const m = assertCan(
      ability,
      'amend',
      'Radiograph',
      await repo.findMeasurement(this.db, scope, measurementId),
      'measurement',
    );
    if (!m.current) throw alreadyAmended('radiograph_measurements');
    const r = await repo.findVisibleRadiograph(this.db, scope, m.radiographId);
    if (!r) throw new NotFoundException('No such measurement');
    const values = await this.compute(r, m.siteId, body.points, body.implantTrueMm ?? m.implantTrueMm);
    const row = {
      ...values,
      practiceId: m.practiceId,
      patientId: m.patientId,
      radiographId: m.radiographId,
      siteId: m.siteId,
      measuredBy: user.id,
      supersedesId: m.id,
      amendmentReason: body.reason,
    };
    const id = await auditedTransaction(this.db, async (tx) => {
      const inserted = await repo.insertMeasurementAmendment(tx, row);
      reportChange({ type: 'RadiographMeasurement', id: inserted, patientId: m.patientId, before: m, after: row });
      return inserted;
    });
    return this.measurement(scope, id);
  }

  private async compute(r: repo.RadiographRow, siteId: string, points: Points, givenLength: number | undefined) {
    const implantTrueMm = givenLength ?? (await repo.currentImplantLength(this.db, siteId));
    if (implantTrueMm === null) {
      throw fieldError({ implantTrueMm: "The site's placement has no implant length; give the implant's true length" });
    }
    try {
      const result = measureBoneLevels({ marks: points, implantTrueMm, pixelSpacing: r.pixelSpacing });
      return {
        points,
        implantTrueMm,
        mmPerUnit: result.mmPerUnit,
        mesialMm: result.mesialMm,
        distalMm: result.distalMm,
        spacingEstimate: result.spacing ? { ...result.spacing } : null,
        rulesVersion: RULES_VERSION,
      };
    } catch (e) {
      if (e instanceof ValidationError) throw fieldError({ [`points.${e.field ?? 'apex'}`]: e.message });
      throw e;
    }
  }

  private async measurement(scope: Scope, id: string): Promise<Measurement> {
    const m = await repo.findMeasurement(this.db, scope, id);
    if (!m) throw new NotFoundException('No such measurement');
    return toMeasurement(m);
  }
}
