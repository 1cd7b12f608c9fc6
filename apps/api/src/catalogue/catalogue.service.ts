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
  WrenchBody,
  ComponentBody as ComponentBodySchema,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import { assertCan, type Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import * as repo from './catalogue.repository.js';

type ComponentRow = Awaited<ReturnType<typeof repo.listComponents>>[number];
const toComponent = ({ practiceId: _p, ...c }: ComponentRow): CatalogueComponent => c;
const toWrench = ({ practiceId: _p, ...w }: NonNullable<Awaited<ReturnType<typeof repo.findWrench>>>): Wrench => w;

@Injectable()
export class CatalogueService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /** The practice's own catalogue (each practice keeps its own values). */
  async catalogue(scope: Scope): Promise<CatalogueReply> {
    const [systems, platforms, components] = await Promise.all([
      repo.listSystems(this.db, scope.practiceId),
      repo.listPlatforms(this.db, scope.practiceId),
      repo.listComponents(this.db, scope.practiceId),
    ]);
    return {
      caution: MANUFACTURER_CAUTION,
      systems: systems.map((s) => ({
        id: s.id,
        name: s.name,
        manufacturer: s.manufacturer,
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
    const id = await repo.insertSystem(this.db, { ...body, practiceId: scope.practiceId });
    return this.system(scope, id);
  }

  async updateSystem(ability: AppAbility, scope: Scope, id: string, patch: SystemPatch): Promise<CatalogueSystem> {
    assertCan(ability, 'update', 'Catalogue', await repo.findSystem(this.db, scope.practiceId, id), 'implant system');
    await repo.updateSystem(this.db, scope.practiceId, id, patch);
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
    const id = await repo.insertPlatform(this.db, { ...body, practiceId: scope.practiceId });
    return this.platform(scope, id);
  }

  async updatePlatform(
    ability: AppAbility,
    scope: Scope,
    id: string,
    patch: PlatformPatch,
  ): Promise<CataloguePlatform> {
    assertCan(ability, 'update', 'Catalogue', await repo.findPlatform(this.db, scope.practiceId, id), 'platform');
    await repo.updatePlatform(this.db, scope.practiceId, id, patch);
    return this.platform(scope, id);
  }

  async createComponent(
    ability: AppAbility,
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
    const id = await repo.insertComponent(this.db, { ...body, practiceId: scope.practiceId });
    return toComponent((await repo.findComponents(this.db, scope.practiceId, [id]))[0]);
  }

  /** Create + update only: a part recorded in a patient is never deleted, so history keeps its meaning. */
  async updateComponent(
    ability: AppAbility,
    scope: Scope,
    id: string,
    patch: ComponentPatch,
  ): Promise<CatalogueComponent> {
    const [row] = await repo.findComponents(this.db, scope.practiceId, [id]);
    assertCan(ability, 'update', 'Catalogue', row, 'component');
    await repo.updateComponent(this.db, scope.practiceId, id, patch);
    return toComponent((await repo.findComponents(this.db, scope.practiceId, [id]))[0]);
  }

  async wrenches(scope: Scope): Promise<WrenchListReply> {
    return { items: (await repo.listWrenches(this.db, scope.practiceId)).map(toWrench) };
  }

  async createWrench(ability: AppAbility, scope: Scope, body: z.output<typeof WrenchBody>): Promise<Wrench> {
    assertCan(ability, 'create', 'Wrench', { practiceId: scope.practiceId }, 'wrench');
    const id = await repo.insertWrench(this.db, { ...body, practiceId: scope.practiceId });
    return toWrench(await repo.findWrench(this.db, scope.practiceId, id));
  }

  async updateWrench(ability: AppAbility, scope: Scope, id: string, patch: WrenchPatch): Promise<Wrench> {
    assertCan(ability, 'update', 'Wrench', await repo.findWrench(this.db, scope.practiceId, id), 'wrench');
    await repo.updateWrench(this.db, scope.practiceId, id, patch);
    return toWrench(await repo.findWrench(this.db, scope.practiceId, id));
  }
}
