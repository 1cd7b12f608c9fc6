import { ConflictException, Inject, Injectable, NotFoundException } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  ImpressionAmendmentBody,
  type Impression,
  type ImpressionBody,
  type ImpressionListReply,
  type ImpressionSettings,
  type ScanFile,
} from '@torquetrail/contracts';
import { checkScanBodies, type Finding, impressionLevelFindings, seatingRadiographFindings } from '@torquetrail/domain';
import { currentPartVersions } from '../db/catalogue-parts.js';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { assertAmendable } from '../common/amendment-conflict.js';
import { reportChange } from '../common/audit-context.js';
import { fieldError } from '../common/field-error.js';
import { keepAbsent } from '../common/keep-absent.js';
import { isUniqueViolation } from '../common/postgres-error.js';
import { impressionSettings } from '../db/practice-settings.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database } from '../db/database.js';
import * as repo from './impressions.repository.js';
import { markedSites } from './scan-body-markers.repository.js';

type Body = z.output<typeof ImpressionBody>;

/** The impression as the lab prescription and its e-mail name it. */
export interface ImpressionLabSheet {
  method: Impression['method'];
  takenOn: string;
  /** `marked`: a marker of it is placed on one of the scan files (where the lab finds it on the mesh). */
  scanBodies: { fdi: number; name: string; referenceCode: string; lot: string | null; marked: boolean }[];
  files: { id: string; name: string; fileType: ScanFile['fileType']; sizeBytes: number; objectKey: string }[];
}
type ScanBodyRow = Awaited<ReturnType<typeof repo.scanBodiesOf>>[number];

/** The latest calendar date anywhere on Earth now (UTC+14): a later date has not happened yet. */
const latestPossibleToday = () => new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);

export const toScanFile = (f: repo.ScanFileRow): ScanFile => ({
  id: f.id,
  impressionId: f.impressionId,
  fileType: f.fileType,
  originalName: f.originalName,
  sizeBytes: f.sizeBytes,
  sha256: f.sha256,
  uploadedBy: f.uploadedByName,
  uploadedAt: f.uploadedAt.toISOString(),
});

const toImpression = (i: repo.ImpressionRow, bodies: ScanBodyRow[]): Impression => ({
  id: i.id,
  restorationId: i.restorationId,
  method: i.method,
  takenOn: i.takenOn,
  scanBodies: bodies
    .filter((b) => b.impressionId === i.id)
    .map((b) => ({
      siteId: b.siteId,
      fdi: b.fdi,
      componentId: b.componentId,
      name: b.name,
      referenceCode: b.referenceCode,
      lot: b.lot,
    })),
  note: i.note,
  recordedBy: i.recordedByName,
  recordedAt: i.recordedAt.toISOString(),
  supersedesId: i.supersedesId,
  amendmentReason: i.amendmentReason,
  current: i.supersededById === null,
});

const alreadyRecorded = () =>
  new ConflictException("This restoration's impression is already recorded; amend it instead");

/**
 * The impression of a restoration: analog, or digital with one scan body per site (the domain's
 * `checkScanBodies`: of the site's platform, with its lot). Recorded and amended by the dentist;
 * no share opens it to a surgeon (the `Impression` subject).
 */
@Injectable()
export class ImpressionsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  async list(ability: AppAbility, scope: Scope, restorationId: string): Promise<ImpressionListReply> {
    const r = assertCan(
      ability,
      'read',
      'Impression',
      await repo.findVisibleRestoration(this.db, scope, restorationId),
      'restoration',
    );
    const rows = await repo.impressionsOfRestoration(this.db, r.id);
    const bodies = await repo.scanBodiesOf(
      this.db,
      rows.map((i) => i.id),
    );
    const files = await repo.scanFilesOfRestoration(this.db, r.id);
    const current = rows.find((i) => i.supersededById === null);
    const findings = current
      ? [
          ...seatingRadiographFindings(
            current.method,
            await repo.hasImpressionSeatingCheck(this.db, r.id),
            (await impressionSettings.read(this.db, r.practiceId)).requireScanBodyRadiograph,
          ),
          ...(await this.levelWarnings(
            r,
            bodies.filter((b) => b.impressionId === current.id),
          )),
        ]
      : [];
    return { items: rows.map((i) => toImpression(i, bodies)), scanFiles: files.map(toScanFile), findings };
  }

  /**
   * Scan bodies whose catalogue entry (its current version: the practice may have stated it since)
   * does not say whether they work at implant level or on a multi-unit: a warning each. A stated
   * level that does not fit was refused when the impression was recorded.
   */
  private async levelWarnings(r: repo.VisibleRestoration, bodies: ScanBodyRow[]): Promise<Finding[]> {
    const now = new Map(
      (
        await currentPartVersions(
          this.db,
          r.practiceId,
          bodies.map((b) => b.componentId),
        )
      ).map((p) => [p.askedId, p]),
    );
    return bodies.flatMap((b) => {
      const part = now.get(b.componentId) ?? b;
      if (part.kind !== 'scan-body') return [];
      return impressionLevelFindings(r.retention, b.fdi, 'scan body', part).filter((f) => f.severity === 'warning');
    });
  }

  settings(scope: Scope): Promise<ImpressionSettings> {
    return impressionSettings.read(this.db, scope.practiceId);
  }

  /** The practice's choice; digital impressions are judged by it from the next time they are read. */
  setSettings(scope: Scope, body: ImpressionSettings): Promise<ImpressionSettings> {
    return impressionSettings.change(this.db, scope.practiceId, body);
  }

  async record(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    restorationId: string,
    body: Body,
  ): Promise<Impression> {
    const r = assertCan(
      ability,
      'create',
      'Impression',
      await repo.findVisibleRestoration(this.db, scope, restorationId),
      'restoration',
    );
    if (!r.current) {
      throw new ConflictException(
        'This version of the restoration was amended; record the impression on its current version',
      );
    }
    const scanBodies = await this.checked(r, body);
    if (await repo.firstImpressionOf(this.db, r.id)) throw alreadyRecorded();
    let id: string;
    try {
      id = await auditedTransaction(this.db, async (tx) => {
        const newId = await repo.insertImpression(tx, {
          practiceId: r.practiceId,
          patientId: r.patientId,
          restorationId: r.id,
          method: body.method,
          takenOn: body.takenOn,
          note: body.note,
          recordedBy: user.id,
        });
        await repo.insertScanBodies(
          tx,
          scanBodies.map((b) => ({ ...b, practiceId: r.practiceId, impressionId: newId })),
        );
        reportChange({ type: 'Impression', id: newId, patientId: r.patientId, after: { ...body, scanBodies } });
        return newId;
      });
    } catch (e) {
      // Two first impressions of one restoration raced: the partial unique index decided.
      if (isUniqueViolation(e, 'impressions_first_unique')) throw alreadyRecorded();
      throw e;
    }
    return this.impression(scope, id);
  }

  async amend(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    impressionId: string,
    body: z.output<typeof ImpressionAmendmentBody>,
  ): Promise<Impression> {
    const old = assertAmendable(
      ability,
      'Impression',
      await repo.findImpression(this.db, scope, impressionId),
      'impression',
      'impressions',
    );
    const r = await repo.findVisibleRestoration(this.db, scope, old.restorationId);
    if (!r) throw new NotFoundException('No such impression');
    const oldBodies = (await repo.scanBodiesOf(this.db, [old.id])).map((b) => ({
      siteId: b.siteId,
      componentId: b.componentId,
      lot: b.lot,
    }));
    // What the amendment leaves out stays as it was.
    const next = keepAbsent(ImpressionAmendmentBody, body, { ...old, scanBodies: oldBodies });
    const scanBodies = await this.checked(r, next);
    const id = await auditedTransaction(this.db, async (tx) => {
      const newId = await repo.insertImpressionAmendment(tx, {
        practiceId: old.practiceId,
        patientId: old.patientId,
        restorationId: old.restorationId,
        method: next.method,
        takenOn: next.takenOn,
        note: next.note,
        recordedBy: user.id,
        supersedesId: old.id,
        amendmentReason: body.reason,
      });
      await repo.insertScanBodies(
        tx,
        scanBodies.map((b) => ({ ...b, practiceId: old.practiceId, impressionId: newId })),
      );
      reportChange({
        type: 'Impression',
        id: newId,
        patientId: old.patientId,
        before: { method: old.method, takenOn: old.takenOn, note: old.note, scanBodies: oldBodies },
        after: { method: next.method, takenOn: next.takenOn, note: next.note, scanBodies },
      });
      return newId;
    });
    return this.impression(scope, id);
  }

  /**
   * 400 naming the field for a date in the future, a site that is not the restoration's, a part
   * not in the practice's catalogue, and every Finding of `checkScanBodies` (which names the site).
   * The scan bodies to store: each part resolved to its current catalogue version (ADR 0006).
   */
  private async checked(r: repo.VisibleRestoration, body: Pick<Body, 'method' | 'takenOn' | 'scanBodies'>) {
    const fields: Record<string, string> = {};
    if (body.takenOn > latestPossibleToday()) fields.takenOn = 'The impression date cannot be in the future';
    r.sites.forEach((s) => {
      if (!s.platformId) fields.scanBodies = `No placement is recorded at ${s.fdi}: the implant's platform is unknown`;
    });
    const parts = new Map(
      (
        await repo.scanBodyParts(
          this.db,
          r.practiceId,
          body.scanBodies.map((b) => b.componentId),
        )
      ).map((p) => [p.askedId, p]),
    );
    type Part = NonNullable<ReturnType<typeof parts.get>>;
    const entries: (Parameters<typeof checkScanBodies>[2][number] & { part: Part })[] = [];
    const stored: { siteId: string; componentId: string; lot: string | null }[] = [];
    const indexOfFdi = new Map<number, number>();
    body.scanBodies.forEach((b, i) => {
      const site = r.sites.find((s) => s.siteId === b.siteId);
      const part = parts.get(b.componentId);
      if (!site) fields[`scanBodies.${i}.siteId`] = "Not one of this restoration's sites";
      if (!part) fields[`scanBodies.${i}.componentId`] = 'No such part in the practice catalogue';
      if (!site || !part) return;
      indexOfFdi.set(site.fdi, i);
      entries.push({ fdi: site.fdi, lot: b.lot, part });
      stored.push({ siteId: site.siteId, componentId: part.id, lot: b.lot });
    });
    if (Object.keys(fields).length === 0) {
      const sites = r.sites.map((s) => ({
        fdi: s.fdi,
        platformId: s.platformId ?? '',
        platformName: s.platformName ?? '',
      }));
      // A scan body of the right platform must also record the level the restoration is made on.
      const levels = entries.flatMap((e) =>
        e.part.kind === 'scan-body'
          ? impressionLevelFindings(r.retention, e.fdi, 'scan body', e.part).filter((f) => f.severity === 'error')
          : [],
      );
      for (const f of [...checkScanBodies(body.method, sites, entries), ...levels]) {
        const i = f.fdi === undefined ? undefined : indexOfFdi.get(f.fdi);
        const key =
          i === undefined
            ? 'scanBodies'
            : `scanBodies.${i}.${f.code === 'scan-body-lot-missing' ? 'lot' : 'componentId'}`;
        fields[key] ??= f.message;
      }
    }
    if (Object.keys(fields).length > 0) throw fieldError(fields);
    return stored;
  }

  /**
   * What the lab prescription says of the impression (no ability check: the caller has loaded the
   * restoration in the user's scope): its current version with the scan bodies per site and every
   * scan file of the restoration (name, format, size, and the key the lab mail reads it by).
   */
  async labSheet(restorationId: string): Promise<ImpressionLabSheet | null> {
    const current = (await repo.impressionsOfRestoration(this.db, restorationId)).find(
      (i) => i.supersededById === null,
    );
    if (!current) return null;
    const bodies = await repo.scanBodiesOf(this.db, [current.id]);
    const files = await repo.scanFilesOfRestoration(this.db, restorationId);
    const marked = await markedSites(
      this.db,
      files.map((f) => f.id),
    );
    return {
      method: current.method,
      takenOn: current.takenOn,
      scanBodies: bodies.map((b) => ({
        fdi: b.fdi,
        name: b.name,
        referenceCode: b.referenceCode,
        lot: b.lot,
        marked: marked.has(b.siteId),
      })),
      files: files.map((f) => ({
        id: f.id,
        name: f.originalName ?? `scan-${f.id.slice(0, 8)}.${f.fileType}`,
        fileType: f.fileType,
        sizeBytes: f.sizeBytes,
        objectKey: f.objectKey,
      })),
    };
  }

  private async impression(scope: Scope, id: string): Promise<Impression> {
    const i = await repo.findImpression(this.db, scope, id);
    if (!i) throw new NotFoundException('No such impression');
    return toImpression(i, await repo.scanBodiesOf(this.db, [i.id]));
  }
}
