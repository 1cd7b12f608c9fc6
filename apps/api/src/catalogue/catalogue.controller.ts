import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Post, Put, HttpStatus } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import {
  WrenchSettings,
  type Calibration,
  CalibrationBody,
  type CalibrationListReply,
  type ComponentVersionsReply,
  type CatalogueComponent,
  type CataloguePlatform,
  type CatalogueReply,
  type CatalogueSystem,
  ComponentBody,
  ComponentPatch,
  PlatformBody,
  PlatformPatch,
  SystemBody,
  SystemPatch,
  type Wrench,
  WrenchBody,
  type WrenchListReply,
  WrenchPatch,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import type { SessionUser } from '../auth/session-user.js';
import { Allow } from '../authz/check-ability.decorator.js';
import { scopeOf } from '../authz/scope.js';
import { CurrentAbility, CurrentUser } from '../common/current-user.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { CatalogueService } from './catalogue.service.js';

const uuid = () => new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

@Controller()
export class CatalogueController {
  constructor(private readonly catalogue: CatalogueService) {}

  @Get('catalogue')
  @Allow('read', 'Catalogue')
  list(@CurrentUser() user: SessionUser): Promise<CatalogueReply> {
    return this.catalogue.catalogue(scopeOf(user));
  }

  @Post('catalogue/systems')
  @Allow('create', 'Catalogue')
  createSystem(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(SystemBody)) body: SystemBody,
  ): Promise<CatalogueSystem> {
    return this.catalogue.createSystem(ability, scopeOf(user), body);
  }

  @Patch('catalogue/systems/:id')
  @Allow('update', 'Catalogue')
  updateSystem(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(SystemPatch)) body: z.output<typeof SystemPatch>,
  ): Promise<CatalogueSystem> {
    return this.catalogue.updateSystem(ability, user, scopeOf(user), id, body);
  }

  @Post('catalogue/platforms')
  @Allow('create', 'Catalogue')
  createPlatform(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(PlatformBody)) body: PlatformBody,
  ): Promise<CataloguePlatform> {
    return this.catalogue.createPlatform(ability, scopeOf(user), body);
  }

  @Patch('catalogue/platforms/:id')
  @Allow('update', 'Catalogue')
  updatePlatform(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(PlatformPatch)) body: PlatformPatch,
  ): Promise<CataloguePlatform> {
    return this.catalogue.updatePlatform(ability, scopeOf(user), id, body);
  }

  @Post('catalogue/components')
  @Allow('create', 'Catalogue')
  createComponent(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(ComponentBody)) body: z.output<typeof ComponentBody>,
  ): Promise<CatalogueComponent> {
    return this.catalogue.createComponent(ability, user, scopeOf(user), body);
  }

  @Patch('catalogue/components/:id')
  @Allow('update', 'Catalogue')
  updateComponent(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(ComponentPatch)) body: ComponentPatch,
  ): Promise<CatalogueComponent> {
    return this.catalogue.updateComponent(ability, user, scopeOf(user), id, body);
  }

  @Get('catalogue/components/:id/versions')
  @Allow('read', 'Catalogue')
  componentVersions(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<ComponentVersionsReply> {
    return this.catalogue.componentVersions(ability, scopeOf(user), id);
  }

  @Get('wrenches')
  @Allow('read', 'Wrench')
  wrenches(@CurrentUser() user: SessionUser): Promise<WrenchListReply> {
    return this.catalogue.wrenches(scopeOf(user));
  }

  @Post('wrenches')
  @Allow('create', 'Wrench')
  createWrench(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Body(new ZodValidationPipe(WrenchBody)) body: z.output<typeof WrenchBody>,
  ): Promise<Wrench> {
    return this.catalogue.createWrench(ability, user, scopeOf(user), body);
  }

  @Patch('wrenches/:id')
  @Allow('update', 'Wrench')
  updateWrench(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(WrenchPatch)) body: WrenchPatch,
  ): Promise<Wrench> {
    return this.catalogue.updateWrench(ability, user, scopeOf(user), id, body);
  }

  @Put('practice/wrench-settings')
  @Allow('update', 'Practice')
  setWrenchSettings(
    @CurrentUser() user: SessionUser,
    @Body(new ZodValidationPipe(WrenchSettings)) body: WrenchSettings,
  ): Promise<WrenchSettings> {
    return this.catalogue.setWrenchSettings(scopeOf(user), body.calibrationIntervalMonths);
  }

  @Get('wrenches/:id/calibrations')
  @Allow('read', 'Wrench')
  calibrations(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
  ): Promise<CalibrationListReply> {
    return this.catalogue.calibrations(ability, scopeOf(user), id);
  }

  @Post('wrenches/:id/calibrations')
  @Allow('update', 'Wrench')
  addCalibration(
    @CurrentUser() user: SessionUser,
    @CurrentAbility() ability: AppAbility,
    @Param('id', uuid()) id: string,
    @Body(new ZodValidationPipe(CalibrationBody)) body: z.output<typeof CalibrationBody>,
  ): Promise<Calibration> {
    return this.catalogue.addCalibration(ability, user, scopeOf(user), id, body);
  }
}
