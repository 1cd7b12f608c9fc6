import { type DynamicModule, Module } from '@nestjs/common';
import { APP_FILTER, APP_GUARD, APP_INTERCEPTOR } from '@nestjs/core';
import { AuditModule } from './audit/audit.module.js';
import { AuditInterceptor } from './audit/audit.interceptor.js';
import { AuthModule } from './auth/auth.module.js';
import { JwtAuthGuard } from './auth/jwt-auth.guard.js';
import { AbilityGuard } from './authz/ability.guard.js';
import { HttpExceptionFilter } from './common/http-exception.filter.js';
import { ConfigModule } from './config/config.module.js';
import type { Env } from './config/env.js';
import { DatabaseModule } from './db/database.module.js';
import { HealthModule } from './health/health.module.js';
import { JobsModule } from './jobs/jobs.module.js';
import { MailModule } from './mail/mail.module.js';
import { OpenApiModule } from './openapi/openapi.module.js';
import { PatientsModule } from './patients/patients.module.js';
import { RecallsModule } from './recalls/recalls.module.js';
import { SitesModule } from './sites/sites.module.js';
import { CatalogueModule } from './catalogue/catalogue.module.js';
import { ComplicationsModule } from './complications/complications.module.js';
import { InsertChangesModule } from './insert-changes/insert-changes.module.js';
import { LabPrescriptionsModule } from './lab-prescriptions/lab-prescriptions.module.js';
import { RestorationsModule } from './restorations/restorations.module.js';
import { TorqueModule } from './torque/torque.module.js';
import { PlacementsModule } from './placements/placements.module.js';
import { StorageModule } from './storage/storage.module.js';
import { RadiographsModule } from './radiographs/radiographs.module.js';
import { SeatingModule } from './seating/seating.module.js';
import { ImpressionsModule } from './impressions/impressions.module.js';
import { PeopleModule } from './people/people.module.js';
import { OutcomesModule } from './outcomes/outcomes.module.js';
import { SharesModule } from './shares/shares.module.js';
import { FieldRulesInterceptor } from './authz/field-rules.interceptor.js';
import { RecordsOutModule } from './records-out/records-out.module.js';
import { ImportsModule } from './imports/imports.module.js';

@Module({})
export class AppModule {
  static forRoot(env: Env): DynamicModule {
    return {
      module: AppModule,
      imports: [
        ConfigModule.forRoot(env),
        DatabaseModule,
        AuditModule,
        StorageModule,
        MailModule,
        JobsModule,
        AuthModule,
        HealthModule,
        PatientsModule,
        SitesModule,
        CatalogueModule,
        RestorationsModule,
        LabPrescriptionsModule,
        OutcomesModule,
        TorqueModule,
        PlacementsModule,
        ComplicationsModule,
        InsertChangesModule,
        RecallsModule,
        RadiographsModule,
        SeatingModule,
        ImpressionsModule,
        PeopleModule,
        SharesModule,
        RecordsOutModule,
        ImportsModule,
        ...(env.NODE_ENV === 'production' ? [] : [OpenApiModule]),
      ],
      providers: [
        // Order matters: who you are (JWT), then what you may do (CASL).
        { provide: APP_GUARD, useClass: JwtAuthGuard },
        { provide: APP_GUARD, useClass: AbilityGuard },
        { provide: APP_FILTER, useClass: HttpExceptionFilter },
        // Every read of patient data, export, change and sign-in leaves its audit row (issue 11).
        { provide: APP_INTERCEPTOR, useClass: AuditInterceptor },
        { provide: APP_INTERCEPTOR, useClass: FieldRulesInterceptor },
      ],
    };
  }
}
