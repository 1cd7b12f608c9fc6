import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import {
  ConflictException,
  HttpException,
  HttpStatus,
  Inject,
  Injectable,
  PayloadTooLargeException,
  ServiceUnavailableException,
  UnprocessableEntityException,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { RadiographUploadQuery } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { postgresError } from '../common/postgres-error.js';
import { ENV, type Env } from '../config/env.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { StorageService } from '../storage/storage.service.js';
import { dicomAttributes, DicomUnreadable, parseDicom, withPreamble, type DicomAttributes } from './dicom.js';
import { CONTENT_TYPES, detectFileType } from './file-type.js';
import { imageSizeFromHead } from './preview.js';
import * as repo from './radiographs.repository.js';
import { StreamSlots } from '../storage/stream-slots.js';
import { drainUnread, putSplit, removeQuietly, splitHead, TooLarge } from '../storage/upload-stream.js';

type UploadQuery = z.output<typeof RadiographUploadQuery>;

const mb = (bytes: number) => `${Math.round(bytes / (1024 * 1024))} MB`;
const STORAGE_DOWN = 'Object storage is unavailable; the radiograph was not saved. Try again in a few minutes';

/**
 * The upload path: type from the first bytes, DICOM header parsed, then the body streamed to S3
 * (never held whole in memory) and the row written last, in one transaction with its site links;
 * when anything after the object fails, the object is deleted again. The preview is made later by
 * a job (radiograph-previews.service.ts).
 */
@Injectable()
export class RadiographUploadService {
  constructor(
    @Inject(DB) private readonly db: Database,
    @Inject(ENV) private readonly env: Env,
    private readonly storage: StorageService,
    private readonly slots: StreamSlots,
  ) {}

  /** Stores the file and its row; the new radiograph's id (its preview is queued by the caller). */
  async upload(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    patientId: string,
    query: UploadQuery,
    body: Readable,
    declaredLength: number | undefined,
  ): Promise<string> {
    try {
      return await this.receive(ability, user, scope, patientId, query, body, declaredLength);
    } finally {
      drainUnread(body);
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
  ): Promise<string> {
    const patient = assertCan(
      ability,
      'create',
      'Radiograph',
      await repo.findVisiblePatient(this.db, scope, patientId),
      'patient',
    );
    const max = this.env.RADIOGRAPH_MAX_BYTES;
    const tooLarge = () => new PayloadTooLargeException(`The file is larger than the limit of ${mb(max)}`);
    // A declared length over the limit is refused before a byte of the body is read.
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

    // Refusals above cost nothing; from here the body is read, within a slot.
    const release = await this.slots.acquire();
    try {
      return await this.store(user, query, patient, body, tooLarge, siteIds);
    } finally {
      release();
    }
  }

  private async store(
    user: SessionUser,
    query: UploadQuery,
    patient: { id: string; practiceId: string },
    body: Readable,
    tooLarge: () => PayloadTooLargeException,
    siteIds: string[],
  ): Promise<string> {
    const max = this.env.RADIOGRAPH_MAX_BYTES;
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
    const imageSize = dicom ? { rows: dicom.rows, columns: dicom.columns } : await imageSizeFromHead(split.head);

    const id = randomUUID();
    const objectKey = `radiographs/${patient.practiceId}/${patient.id}/${id}`;
    await putSplit(this.storage, objectKey, split, CONTENT_TYPES[detected.type], {
      tooLarge,
      unavailable: () => new ServiceUnavailableException(STORAGE_DOWN),
    });
    let recorded = false;
    try {
      const { size, sha256 } = split.result();
      const existing = await repo.findBySha(this.db, patient.id, sha256);
      if (existing) throw this.duplicate(existing.id);
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
              rows: imageSize.rows,
              columns: imageSize.columns,
              pixelSpacing: dicom?.pixelSpacing ?? null,
              imagerPixelSpacing: dicom?.imagerPixelSpacing ?? null,
              magnificationFactor: dicom?.magnificationFactor ?? null,
              studyDate: dicom?.studyDate ?? null,
              modality: dicom?.modality ?? null,
              bitsStored: dicom?.bitsStored ?? null,
              photometricInterpretation: dicom?.photometricInterpretation ?? null,
              transferSyntaxUid: dicom?.transferSyntaxUid ?? null,
              previewStatus: 'pending',
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
      recorded = true;
    } finally {
      if (!recorded) await removeQuietly(this.storage, objectKey);
    }
    return id;
  }

  private duplicate(existingId: string) {
    return new ConflictException(`This file was already uploaded for this patient as radiograph ${existingId}`);
  }
}
