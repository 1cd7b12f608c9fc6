import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import {
  ConflictException,
  HttpException,
  HttpStatus,
  Inject,
  Injectable,
  NotFoundException,
  PayloadTooLargeException,
  ServiceUnavailableException,
  UnprocessableEntityException,
  UnsupportedMediaTypeException,
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
import { assertCan, type Scope } from '../authz/scope.js';
import { alreadyAmended } from '../common/amendment-conflict.js';
import { fieldError } from '../common/field-error.js';
import { postgresError } from '../common/postgres-error.js';
import { ENV, type Env } from '../config/env.js';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { StorageService } from '../storage/storage.service.js';
import { dicomAttributes, DicomUnreadable, parseDicom, withPreamble, type DicomAttributes } from './dicom.js';
import { CONTENT_TYPES, detectFileType } from './file-type.js';
import { makePreviews } from './preview.js';
import * as repo from './radiographs.repository.js';
import { splitHead, TooLarge } from './upload-stream.js';

type UploadQuery = z.output<typeof RadiographUploadQuery>;
type Points = z.output<typeof MeasurementPoints>;

const mb = (bytes: number) => `${Math.round(bytes / (1024 * 1024))} MB`;
const STORAGE_DOWN = 'Object storage is unavailable; the radiograph was not saved. Try again in a few minutes';

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
  previewProblem: r.previewProblem,
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
    @Inject(ENV) private readonly env: Env,
    private readonly storage: StorageService,
  ) {}

  /**
   * Upload: type from the first bytes, DICOM header parsed, then the body streamed to S3; previews
   * made from the stored object; the row written last, in one transaction with its site links. When
   * anything after the object fails, the objects are deleted again.
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
    try {
      return await this.receive(ability, user, scope, patientId, query, body, declaredLength);
    } finally {
      // A refused body is drained so the client can read the answer instead of a reset connection.
      if (!body.readableEnded) body.resume();
    }
  }

  private async receive(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    patientId: string,
    query: UploadQuery,
    body: Readable,
    declaredLength: number | undefined,
  ): Promise<Radiograph> {
    const patient = assertCan(
      ability,
      'create',
      'Radiograph',
      await repo.findVisiblePatient(this.db, scope, patientId),
      'patient',
    );
    const max = this.env.RADIOGRAPH_MAX_BYTES;
    const tooLarge = () => new PayloadTooLargeException(`The file is larger than the limit of ${mb(max)}`);
    if (declaredLength !== undefined && declaredLength > max) throw tooLarge();
    const siteIds = [...new Set(query.siteIds)];
    const known = await repo.sitesOfPatient(this.db, patient.id, siteIds);
    if (known.length !== siteIds.length) throw fieldError({ siteIds: 'Choose implant sites of this patient' });
    const since = new Date(new Date().toISOString().slice(0, 10) + 'T00:00:00Z');
    const used = await repo.bytesUploadedSince(this.db, user.id, since);
    if (used + (declaredLength ?? 0) > this.env.RADIOGRAPH_DAILY_QUOTA_BYTES) {
      throw new HttpException(
        `Your daily upload allowance of ${mb(this.env.RADIOGRAPH_DAILY_QUOTA_BYTES)} is used up; try again tomorrow`,
        HttpStatus.TOO_MANY_REQUESTS,
      );
    }

    let split: Awaited<ReturnType<typeof splitHead>>;
    try {
      split = await splitHead(body, max);
    } catch (e) {
      throw e instanceof TooLarge ? tooLarge() : e;
    }
    const detected = detectFileType(split.head);
    if (detected.type === null) {
      throw new UnsupportedMediaTypeException(
        `The file is ${detected.described}; send a PNG, JPEG or DICOM (Part 10) radiograph`,
      );
    }
    let dicom: DicomAttributes | null = null;
    if (detected.type === 'dicom') {
      try {
        dicom = dicomAttributes(parseDicom(withPreamble(split.head, detected.dicomPreamble ?? true), true));
      } catch (e) {
        if (e instanceof DicomUnreadable) throw new UnprocessableEntityException(e.message);
        throw e;
      }
    }

    const id = randomUUID();
    const objectKey = `radiographs/${patient.practiceId}/${patient.id}/${id}`;
    const stored: string[] = [];
    try {
      try {
        await this.storage.putStream(objectKey, split.stream(), CONTENT_TYPES[detected.type]);
      } catch (e) {
        if (e instanceof TooLarge) throw tooLarge();
        throw new ServiceUnavailableException(STORAGE_DOWN);
      }
      stored.push(objectKey);
      const { size, sha256 } = split.result();
      const existing = await repo.findBySha(this.db, patient.id, sha256);
      if (existing) throw this.duplicate(existing.id);

      const original = await this.storage.get(objectKey);
      const bytes = detected.type === 'dicom' ? withPreamble(original, detected.dicomPreamble ?? true) : original;
      const previews = await makePreviews(detected.type, bytes);
      if (previews.ok) {
        await this.storage.put(`${objectKey}.preview.png`, previews.preview, 'image/png');
        stored.push(`${objectKey}.preview.png`);
        await this.storage.put(`${objectKey}.thumbnail.png`, previews.thumbnail, 'image/png');
        stored.push(`${objectKey}.thumbnail.png`);
      }
      try {
        await auditedTransaction(this.db, (tx) => {
          reportChange({
            type: 'Radiograph',
            id,
            patientId: patient.id,
            after: { kind: query.kind, fileType: detected.type, sizeBytes: size, sha256, siteIds },
          });
          return repo.insertRadiograph(
            tx,
            {
              id,
              practiceId: patient.practiceId,
              patientId: patient.id,
              objectKey,
              sizeBytes: size,
              sha256,
              fileType: detected.type,
              originalName: query.fileName,
              kind: query.kind,
              takenOn: query.takenOn ?? dicom?.studyDate ?? null,
              note: query.note,
              rows: dicom?.rows ?? (previews.ok ? previews.height : null),
              columns: dicom?.columns ?? (previews.ok ? previews.width : null),
              pixelSpacing: dicom?.pixelSpacing ?? null,
              imagerPixelSpacing: dicom?.imagerPixelSpacing ?? null,
              magnificationFactor: dicom?.magnificationFactor ?? null,
              studyDate: dicom?.studyDate ?? null,
              modality: dicom?.modality ?? null,
              bitsStored: dicom?.bitsStored ?? null,
              photometricInterpretation: dicom?.photometricInterpretation ?? null,
              transferSyntaxUid: dicom?.transferSyntaxUid ?? null,
              previewProblem: previews.ok ? null : previews.problem,
              uploadedBy: user.id,
            },
            siteIds,
          );
        });
      } catch (e) {
        // Two uploads of the same file raced: the unique index decided.
        if (postgresError(e)?.constraint === 'radiographs_patient_sha256_unique') {
          const winner = await repo.findBySha(this.db, patient.id, sha256);
          throw this.duplicate(winner?.id ?? 'unknown');
        }
        throw e;
      }
      stored.length = 0;
    } finally {
      await this.removeObjects(stored);
    }
    return this.detail(ability, scope, id);
  }

  private duplicate(existingId: string) {
    return new ConflictException(`This file was already uploaded for this patient as radiograph ${existingId}`);
  }

  /** Best effort: an object left behind by a storage outage is unreferenced, never shown. */
  private async removeObjects(keys: readonly string[]): Promise<void> {
    for (const key of keys) {
      try {
        await this.storage.delete(key);
      } catch {
        // nothing more to do: the row does not exist, so nothing points at the object
      }
    }
  }

  async list(ability: AppAbility, scope: Scope, patientId: string, includeEnteredInError: boolean) {
    assertCan(ability, 'read', 'Radiograph', await repo.findVisiblePatient(this.db, scope, patientId), 'patient');
    const rows = await repo.listForPatient(this.db, scope, patientId, includeEnteredInError);
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
    if (which !== 'original' && r.previewProblem) throw new UnprocessableEntityException(r.previewProblem);
    const key = which === 'original' ? r.objectKey : `${r.objectKey}.${which}.png`;
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
