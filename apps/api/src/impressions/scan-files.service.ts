import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import {
  ConflictException,
  GoneException,
  Inject,
  Injectable,
  NotFoundException,
  PayloadTooLargeException,
  ServiceUnavailableException,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { ScanFile, ScanFileUploadQuery } from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { reportChange } from '../common/audit-context.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { ENV, type Env } from '../config/env.js';
import { auditedTransaction, insertAuditEvent } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import { StorageService } from '../storage/storage.service.js';
import { StreamSlots } from '../storage/stream-slots.js';
import { drainUnread, putSplit, removeQuietly, splitHead, TooLarge } from '../storage/upload-stream.js';
import { toScanFile } from './impressions.service.js';
import * as repo from './impressions.repository.js';
import { verifyLabFileLink } from './lab-file-link.js';
import { detectMesh, MESH_CONTENT_TYPES } from './mesh-type.js';

const mb = (bytes: number) => `${Math.round(bytes / (1024 * 1024))} MB`;
const STORAGE_DOWN = 'Object storage is unavailable; the scan file was not saved. Try again in a few minutes';
const NOT_A_MESH = (what: string) => `The file is ${what}; send an STL, PLY or OBJ scan file`;
const duplicate = (id: string) =>
  new ConflictException(`This file was already uploaded for this restoration as scan file ${id}`);

/**
 * Scan files of a digital impression, streamed exactly as radiographs are (storage/upload-stream):
 * the type from the first bytes, the body streamed to S3 within a stream slot and never held whole,
 * the row written last, and the object removed again when anything after it fails.
 */
@Injectable()
export class ScanFilesService {
  constructor(
    @Inject(DB) private readonly db: Database,
    @Inject(ENV) private readonly env: Env,
    private readonly storage: StorageService,
    private readonly slots: StreamSlots,
  ) {}

  async upload(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    impressionId: string,
    query: z.output<typeof ScanFileUploadQuery>,
    body: Readable,
    declaredLength: number | undefined,
  ): Promise<ScanFile> {
    try {
      const impression = assertCan(
        ability,
        'create',
        'Impression',
        await repo.findImpression(this.db, scope, impressionId),
        'impression',
      );
      if (impression.supersededById) {
        throw new ConflictException('This impression was amended; upload the file to its current version');
      }
      if (impression.method !== 'digital') {
        throw new ConflictException('Scan files belong to a digital impression; this one is analog');
      }
      const max = this.env.SCAN_FILE_MAX_BYTES;
      const tooLarge = () => new PayloadTooLargeException(`The file is larger than the limit of ${mb(max)}`);
      // A declared length over the limit is refused before a byte of the body is read.
      if (declaredLength !== undefined && declaredLength > max) throw tooLarge();
      const release = await this.slots.acquire();
      let id: string;
      try {
        id = await this.store(user, impression, query.fileName, body, max, tooLarge);
      } finally {
        release();
      }
      const row = await repo.findScanFile(this.db, scope, id);
      if (!row) throw new NotFoundException('No such scan file');
      return toScanFile(row);
    } finally {
      drainUnread(body);
    }
  }

  private async store(
    user: SessionUser,
    impression: repo.ImpressionRow,
    fileName: string | null,
    body: Readable,
    max: number,
    tooLarge: () => PayloadTooLargeException,
  ): Promise<string> {
    let split: Awaited<ReturnType<typeof splitHead>>;
    try {
      split = await splitHead(body, max);
    } catch (e) {
      throw e instanceof TooLarge ? tooLarge() : e;
    }
    const detected = detectMesh(split.head);
    if (detected.type === null) throw new UnsupportedMediaTypeException(NOT_A_MESH(detected.described));
    const type = detected.type;
    const id = randomUUID();
    const objectKey = `scan-files/${impression.practiceId}/${impression.patientId}/${id}`;
    await putSplit(this.storage, objectKey, split, MESH_CONTENT_TYPES[type], {
      tooLarge,
      unavailable: () => new ServiceUnavailableException(STORAGE_DOWN),
    });
    let recorded = false;
    try {
      const { size, sha256 } = split.result();
      if (detected.stlBinaryBytes !== undefined && detected.stlBinaryBytes !== size) {
        throw new UnsupportedMediaTypeException(
          NOT_A_MESH(
            `not a mesh we can read (as a binary STL it would be ${detected.stlBinaryBytes} bytes, not ${size})`,
          ),
        );
      }
      const existing = await repo.findScanFileBySha(this.db, impression.restorationId, sha256);
      if (existing) throw duplicate(existing.id);
      try {
        await auditedTransaction(this.db, async (tx) => {
          reportChange({
            type: 'ScanFile',
            id,
            patientId: impression.patientId,
            after: { impressionId: impression.id, fileType: type, sizeBytes: size, sha256 },
          });
          await repo.insertScanFile(tx, {
            id,
            practiceId: impression.practiceId,
            patientId: impression.patientId,
            restorationId: impression.restorationId,
            impressionId: impression.id,
            objectKey,
            sizeBytes: size,
            sha256,
            fileType: type,
            originalName: fileName,
            uploadedBy: user.id,
          });
        });
      } catch (e) {
        // Two uploads of the same file raced: the unique index decided.
        if (isUniqueViolation(e, 'scan_files_restoration_sha256_unique')) {
          const winner = await repo.findScanFileBySha(this.db, impression.restorationId, sha256);
          throw duplicate(winner?.id ?? 'unknown');
        }
        throw e;
      }
      recorded = true;
    } finally {
      if (!recorded) await removeQuietly(this.storage, objectKey);
    }
    return id;
  }

  /**
   * The file a lab's mailed link opens (lab-file-link.ts): 404 for a token that does not verify,
   * 410 once it expired. No one is signed in, so the download's audit row is written here: the
   * practice's trail shows the patient's file leaving to the lab, with the address it went to.
   */
  async fileByLink(
    token: string,
    request: { address: string | null; userAgent: string | null; requestId: string | null },
  ) {
    const check = verifyLabFileLink(this.env.JWT_SECRET, token, new Date());
    if (!check.ok && check.reason === 'expired')
      throw new GoneException('This download link has expired; ask the practice to send the prescription again');
    const f = check.ok ? await repo.findScanFileForLink(this.db, check.scanFileId) : null;
    if (!f) throw new NotFoundException('No such download link: check it was copied whole');
    let stream: Readable;
    try {
      stream = await this.storage.getStream(f.objectKey);
    } catch {
      throw new ServiceUnavailableException('Object storage is unavailable; try again in a few minutes');
    }
    await insertAuditEvent(this.db, {
      practiceId: f.practiceId,
      userId: null,
      role: null,
      action: 'export',
      outcome: 'allowed',
      httpStatus: 200,
      route: 'GET /lab-files/:token',
      recordType: 'Impression',
      recordId: f.id,
      patientId: f.patientId,
      query: null,
      before: null,
      after: null,
      ...request,
    });
    return { stream, type: MESH_CONTENT_TYPES[f.fileType], filename: f.originalName ?? `scan-${f.id}.${f.fileType}` };
  }

  async file(ability: AppAbility, scope: Scope, id: string) {
    const f = assertCan(ability, 'read', 'Impression', await repo.findScanFile(this.db, scope, id), 'scan file');
    try {
      const stream = await this.storage.getStream(f.objectKey);
      return { stream, type: MESH_CONTENT_TYPES[f.fileType], filename: `scan-${f.id}.${f.fileType}` };
    } catch {
      throw new ServiceUnavailableException('Object storage is unavailable; try again in a few minutes');
    }
  }
}
