import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  type CatalogueComponent,
  type CataloguePlatform,
  type CatalogueReply,
  type CatalogueSystem,
  type ComponentPatch,
  MANUFACTURER_CAUTION,
  type PlatformBody,
  type PlatformPatch,
  type SystemBody,
  type SystemPatch,
  type Wrench,
  type WrenchListReply,
  type WrenchPatch,
  type WrenchSettings,
  type Calibration,
  type CalibrationListReply,
  type ComponentVersionsReply,
  CalibrationBody,
  WrenchBody,
  ComponentBody as ComponentBodySchema,
  valuesNotForKind,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { assertCan, type Scope } from '../authz/scope.js';
import { alreadyAmended } from '../common/amendment-conflict.js';
import { fieldError } from '../common/field-error.js';
import { reportChange } from '../common/audit-context.js';
import { wrenchSettings } from '../db/practice-settings.js';
import { auditedTransaction } from '../db/audited-transaction.js';
import { DB, type Database, type Tx } from '../db/database.js';
import { calibrationDueOn, calibrationOverdue } from '@torquetrail/domain';
import * as repo from './catalogue.repository.js';

type ComponentRow = Awaited<ReturnType<typeof repo.listComponents>>[number];
const toComponent = ({ practiceId: _p, lineageId: _l, versionedAt, ...c }: ComponentRow): CatalogueComponent => ({
  ...c,
  versionedAt: versionedAt.toISOString(),
});
type WrenchRow = Awaited<ReturnType<typeof repo.listWrenches>>[number];
const today = () => new Date().toISOString().slice(0, 10);
/** A wrench as replied, with when its calibration runs out under the practice's interval. */
const toWrench = ({ practiceId: _p, lineageId: _l, ...w }: WrenchRow, intervalMonths: number): Wrench => ({
  ...w,
  calibrationDueOn: w.lastCalibratedOn ? calibrationDueOn(w.lastCalibratedOn, intervalMonths) : null,
  calibrationOverdue: calibrationOverdue(w.lastCalibratedOn, intervalMonths, today()),
});

@Injectable()
export class CatalogueService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /** One catalogue write in its audited transaction, naming the row it made or changed. */
  private audited(
    type: string,
    write: (tx: Tx) => Promise<string>,
    change: { before?: unknown; after: unknown },
  ): Promise<string> {
    return auditedTransaction(this.db, async (tx) => {
      const id = await write(tx);
      reportChange({ type, id, ...change });
      return id;
    });
  }

  /** The practice's own catalogue (each practice keeps its own values). */
  async catalogue(scope: Scope): Promise<CatalogueReply> {
    const [systems, platforms, components, gtins] = await Promise.all([
      repo.listSystems(this.db, scope.practiceId),
      repo.listPlatforms(this.db, scope.practiceId),
      repo.listComponents(this.db, scope.practiceId),
      repo.listSystemGtins(this.db, scope.practiceId),
    ]);
    return {
      caution: MANUFACTURER_CAUTION,
      systems: systems.map((s) => ({
        id: s.id,
        name: s.name,
        manufacturer: s.manufacturer,
        gtins: gtins.filter((g) => g.systemId === s.id).map(({ gtin, entered }) => ({ gtin, entered })),
        platforms: platforms
          .filter((p) => p.systemId === s.id)
          .map(({ practiceId: _p, ...p }) => ({
            ...p,
            components: components.filter((c) => c.platformId === p.id).map(toComponent),
          })),
      })),
    };
  }

  async system(scope: Scope, id: string): Promise<CatalogueSystem> {
    const found = (await this.catalogue(scope)).systems.find((s) => s.id === id);
    if (!found) throw new Error(`system ${id} vanished`);
    return found;
  }

  async createSystem(ability: AppAbility, scope: Scope, body: SystemBody): Promise<CatalogueSystem> {
    assertCan(ability, 'create', 'Catalogue', { practiceId: scope.practiceId }, 'catalogue');
    const id = await this.audited(
      'CatalogueSystem',
      (tx) => repo.insertSystem(tx, { ...body, practiceId: scope.practiceId }),
      {
        after: body,
      },
    );
    return this.system(scope, id);
  }

  /** Renames a system or gives it GTINs (entered by the user; a learned one is corrected so). */
  async updateSystem(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    { gtins, ...patch }: z.output<typeof SystemPatch>,
  ): Promise<CatalogueSystem> {
    const before = assertCan(
      ability,
      'update',
      'Catalogue',
      await repo.findSystem(this.db, scope.practiceId, id),
      'implant system',
    );
    await this.audited(
      'CatalogueSystem',
      async (tx) => {
        await repo.updateSystem(tx, scope.practiceId, id, patch);
        if (gtins) await repo.enterSystemGtins(tx, { practiceId: scope.practiceId, systemId: id, gtins, by: user.id });
        return id;
      },
      { before, after: { ...patch, ...(gtins ? { gtins } : {}) } },
    );
    return this.system(scope, id);
  }

  private async platform(scope: Scope, id: string): Promise<CataloguePlatform> {
    const { practiceId: _p, ...p } = await repo.findPlatform(this.db, scope.practiceId, id);
    return { ...p, components: (await repo.listComponents(this.db, scope.practiceId, id)).map(toComponent) };
  }

  async createPlatform(ability: AppAbility, scope: Scope, body: PlatformBody): Promise<CataloguePlatform> {
    assertCan(
      ability,
      'update',
      'Catalogue',
      await repo.findSystem(this.db, scope.practiceId, body.systemId),
      'implant system',
    );
    const id = await this.audited(
      'CataloguePlatform',
      (tx) => repo.insertPlatform(tx, { ...body, practiceId: scope.practiceId }),
      {
        after: body,
      },
    );
    return this.platform(scope, id);
  }

  async updatePlatform(
    ability: AppAbility,
    scope: Scope,
    id: string,
    patch: PlatformPatch,
  ): Promise<CataloguePlatform> {
    const before = assertCan(
      ability,
      'update',
      'Catalogue',
      await repo.findPlatform(this.db, scope.practiceId, id),
      'platform',
    );
    await this.audited(
      'CataloguePlatform',
      async (tx) => {
        await repo.updatePlatform(tx, scope.practiceId, id, patch);
        return id;
      },
      { before, after: patch },
    );
    return this.platform(scope, id);
  }

  async createComponent(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    body: z.output<typeof ComponentBodySchema>,
  ): Promise<CatalogueComponent> {
    assertCan(
      ability,
      'create',
      'Catalogue',
      await repo.findPlatform(this.db, scope.practiceId, body.platformId),
      'platform',
    );
    const misplaced = valuesNotForKind(body.kind, body);
    if (Object.keys(misplaced).length > 0) throw fieldError(misplaced);
    const id = await this.audited(
      'CatalogueComponent',
      (tx) => repo.insertComponent(tx, { ...body, practiceId: scope.practiceId, createdBy: user.id }),
      { after: body },
    );
    return this.component(scope, id);
  }

  private async component(scope: Scope, id: string): Promise<CatalogueComponent> {
    const row = await repo.findComponent(this.db, scope.practiceId, id);
    if (!row) throw new Error(`component ${id} vanished`);
    const { supersededById: _s, ...c } = row;
    return toComponent(c);
  }

  /**
   * An edit saves a new version (ADR 0006): installs, torque entries and plans keep pointing at
   * the version they used; new work uses the current one. Only the current version is edited.
   */
  async updateComponent(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    patch: ComponentPatch,
  ): Promise<CatalogueComponent> {
    const row = assertCan(
      ability,
      'update',
      'Catalogue',
      await repo.findComponent(this.db, scope.practiceId, id),
      'component',
    );
    if (row.supersededById) throw alreadyAmended('components');
    const before = {
      name: row.name,
      referenceCode: row.referenceCode,
      engaging: row.engaging,
      angleDeg: row.angleDeg,
      collarHeightMm: row.collarHeightMm,
      maxDivergenceDeg: row.maxDivergenceDeg,
      retentionLabel: row.retentionLabel,
      retentionN: row.retentionN,
      tray: row.tray,
      copingLevel: row.copingLevel,
      torqueSpecNcm: row.torqueSpecNcm,
      tolerancePct: row.tolerancePct,
      requiresLot: row.requiresLot,
    };
    const misplaced = valuesNotForKind(row.kind, patch);
    if (Object.keys(misplaced).length > 0) throw fieldError(misplaced);
    const after = { ...before, ...patch };
    // Saving what is already there makes no version.
    if ((Object.keys(before) as (keyof typeof before)[]).every((k) => before[k] === after[k])) return toComponent(row);
    const newId = await this.audited(
      'CatalogueComponent',
      (tx) =>
        repo.insertComponentVersion(tx, {
          ...after,
          practiceId: row.practiceId,
          platformId: row.platformId,
          kind: row.kind,
          lineageId: row.lineageId,
          supersedesId: row.id,
          createdBy: user.id,
        }),
      { before, after },
    );
    return this.component(scope, newId);
  }

  /** Every version of a part (by the id of any of them), oldest first. */
  async componentVersions(ability: AppAbility, scope: Scope, id: string): Promise<ComponentVersionsReply> {
    const row = assertCan(
      ability,
      'read',
      'Catalogue',
      await repo.findComponent(this.db, scope.practiceId, id),
      'component',
    );
    const versions = await repo.listComponentVersions(this.db, scope.practiceId, row.lineageId);
    return {
      items: versions.map(({ practiceId: _p, lineageId: _l, inUse: _u, versionedAt, ...v }) => ({
        ...v,
        versionedAt: versionedAt.toISOString(),
      })),
    };
  }

  async wrenches(scope: Scope): Promise<WrenchListReply> {
    const [rows, settings] = await Promise.all([
      repo.listWrenches(this.db, scope.practiceId),
      wrenchSettings.read(this.db, scope.practiceId),
    ]);
    return { items: rows.map((w) => toWrench(w, settings.calibrationIntervalMonths)), ...settings };
  }

  /** The practice's wrench calibration interval (months); wrenches are judged against it from now on. */
  setWrenchSettings(scope: Scope, calibrationIntervalMonths: number): Promise<WrenchSettings> {
    return wrenchSettings.change(this.db, scope.practiceId, { calibrationIntervalMonths });
  }

  private async wrench(scope: Scope, id: string): Promise<Wrench> {
    const row = await repo.findWrench(this.db, scope.practiceId, id);
    if (!row) throw new Error(`wrench ${id} vanished`);
    const { supersededById: _s, ...w } = row;
    return toWrench(w, (await wrenchSettings.read(this.db, scope.practiceId)).calibrationIntervalMonths);
  }

  async createWrench(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    body: z.output<typeof WrenchBody>,
  ): Promise<Wrench> {
    assertCan(ability, 'create', 'Wrench', { practiceId: scope.practiceId }, 'wrench');
    if (body.lastCalibratedOn && body.lastCalibratedOn > today())
      throw fieldError({ lastCalibratedOn: 'A calibration date cannot be in the future' });
    const { lastCalibratedOn, ...wrench } = body;
    const id = await this.audited(
      'Wrench',
      (tx) =>
        repo.insertWrench(
          tx,
          { ...wrench, practiceId: scope.practiceId, createdBy: user.id },
          lastCalibratedOn
            ? { practiceId: scope.practiceId, calibratedOn: lastCalibratedOn, note: null, recordedBy: user.id }
            : null,
        ),
      { after: body },
    );
    return this.wrench(scope, id);
  }

  /** Label or type: a new version (ADR 0006); torque entries keep the version they used. */
  async updateWrench(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    patch: WrenchPatch,
  ): Promise<Wrench> {
    const row = assertCan(ability, 'update', 'Wrench', await repo.findWrench(this.db, scope.practiceId, id), 'wrench');
    if (row.supersededById) throw alreadyAmended('torque_wrenches');
    const after = { label: patch.label ?? row.label, type: patch.type ?? row.type };
    if (after.label === row.label && after.type === row.type) return this.wrench(scope, row.id);
    const newId = await this.audited(
      'Wrench',
      (tx) =>
        repo.insertWrenchVersion(tx, {
          ...after,
          practiceId: row.practiceId,
          lineageId: row.lineageId,
          supersedesId: row.id,
          createdBy: user.id,
        }),
      { before: { label: row.label, type: row.type }, after },
    );
    return this.wrench(scope, newId);
  }

  /** A wrench's calibrations (any version's id names the instrument), newest first. */
  async calibrations(ability: AppAbility, scope: Scope, id: string): Promise<CalibrationListReply> {
    const row = assertCan(ability, 'read', 'Wrench', await repo.findWrench(this.db, scope.practiceId, id), 'wrench');
    const items = await repo.listCalibrations(this.db, scope.practiceId, row.lineageId);
    return { items: items.map((c) => ({ ...c, recordedAt: c.recordedAt.toISOString() })) };
  }

  /** A calibration is added to the history, never overwritten; a date in the future is refused. */
  async addCalibration(
    ability: AppAbility,
    user: SessionUser,
    scope: Scope,
    id: string,
    body: z.output<typeof CalibrationBody>,
  ): Promise<Calibration> {
    const row = assertCan(ability, 'update', 'Wrench', await repo.findWrench(this.db, scope.practiceId, id), 'wrench');
    if (body.calibratedOn > today()) throw fieldError({ calibratedOn: 'A calibration date cannot be in the future' });
    const newId = await this.audited(
      'WrenchCalibration',
      (tx) =>
        repo.insertCalibration(tx, {
          practiceId: row.practiceId,
          wrenchLineageId: row.lineageId,
          calibratedOn: body.calibratedOn,
          note: body.note,
          recordedBy: user.id,
        }),
      { after: body },
    );
    const found = (await repo.listCalibrations(this.db, scope.practiceId, row.lineageId)).find((c) => c.id === newId);
    if (!found) throw new Error(`calibration ${newId} vanished`);
    return { ...found, recordedAt: found.recordedAt.toISOString() };
  }
}
