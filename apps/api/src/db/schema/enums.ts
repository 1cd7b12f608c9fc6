// Every database enum is built from the list that defines it (packages/contracts enums.ts, which
// wraps the domain's and authz's lists), so the database, the contract and the rules cannot drift.
// The order of each list is the order of the PostgreSQL enum: append new values, never reorder.
import {
  AUDIT_ACTIONS,
  AUDIT_OUTCOMES,
  COMPLICATION_KINDS,
  INSERT_CHANGE_REASONS,
  COMPONENT_KINDS,
  CONNECTIONS,
  COPING_LEVELS,
  IMPLANT_INTERFACES,
  IMPRESSION_COPINGS,
  IMPRESSION_METHODS,
  LOADING_PROTOCOLS,
  MATERIALS,
  PATIENT_SEXES,
  PATIENT_VERSION_KINDS,
  PREFERRED_LANGUAGES,
  PERI_IMPLANT_STATUSES,
  PROBING_POSITIONS,
  RADIOGRAPH_FILE_TYPES,
  RADIOGRAPH_KINDS,
  RADIOGRAPH_PREVIEW_STATUSES,
  RECALL_STATUSES,
  REMINDER_KINDS,
  REMINDER_STATUSES,
  RESTORATION_KINDS,
  RESTORATION_STATUSES,
  RETENTIONS,
  ROLES,
  SEATING_ANSWERS,
  SCAN_FILE_TYPES,
  SEATING_EVENTS,
  SHARE_NOTICE_KINDS,
  SHARE_SCOPES,
  SITE_STATUSES,
  TORQUE_REASONS,
  TORQUE_VERDICTS,
  TRAYS,
  WRENCH_TYPES,
  DATE_FORMATS,
} from '@torquetrail/contracts';
import { pgEnum } from 'drizzle-orm/pg-core';

export const roleEnum = pgEnum('role', ROLES);
export const shareScopeEnum = pgEnum('share_scope', SHARE_SCOPES);
export const shareNoticeKindEnum = pgEnum('share_notice_kind', SHARE_NOTICE_KINDS);
export const siteStatusEnum = pgEnum('site_status', SITE_STATUSES);
export const connectionEnum = pgEnum('connection', CONNECTIONS);
export const componentKindEnum = pgEnum('component_kind', COMPONENT_KINDS);
export const trayEnum = pgEnum('impression_tray', TRAYS);
export const copingLevelEnum = pgEnum('coping_level', COPING_LEVELS);
export const loadingProtocolEnum = pgEnum('loading_protocol', LOADING_PROTOCOLS);
export const restorationKindEnum = pgEnum('restoration_kind', RESTORATION_KINDS);
export const retentionEnum = pgEnum('retention', RETENTIONS);
export const restorationStatusEnum = pgEnum('restoration_status', RESTORATION_STATUSES);
export const materialEnum = pgEnum('material', MATERIALS);
export const interfaceEnum = pgEnum('interface_kind', IMPLANT_INTERFACES);
export const impressionCopingEnum = pgEnum('impression_coping_kind', IMPRESSION_COPINGS);
export const torqueReasonEnum = pgEnum('torque_reason', TORQUE_REASONS);
export const torqueVerdictEnum = pgEnum('torque_verdict', TORQUE_VERDICTS);
export const wrenchTypeEnum = pgEnum('wrench_type', WRENCH_TYPES);

export const complicationKindEnum = pgEnum('complication_kind', COMPLICATION_KINDS);
export const insertChangeReasonEnum = pgEnum('insert_change_reason', INSERT_CHANGE_REASONS);
export const periImplantStatusEnum = pgEnum('peri_implant_status', PERI_IMPLANT_STATUSES);
export const probingSiteEnum = pgEnum('probing_site', PROBING_POSITIONS);
export const recallStatusEnum = pgEnum('recall_status', RECALL_STATUSES);
export const reminderKindEnum = pgEnum('reminder_kind', REMINDER_KINDS);
export const reminderStatusEnum = pgEnum('reminder_status', REMINDER_STATUSES);
export const radiographFileTypeEnum = pgEnum('radiograph_file_type', RADIOGRAPH_FILE_TYPES);
export const radiographKindEnum = pgEnum('radiograph_kind', RADIOGRAPH_KINDS);
export const patientSexEnum = pgEnum('patient_sex', PATIENT_SEXES);
export const preferredLanguageEnum = pgEnum('preferred_language', PREFERRED_LANGUAGES);
export const patientVersionKindEnum = pgEnum('patient_version_kind', PATIENT_VERSION_KINDS);
export const auditActionEnum = pgEnum('audit_action', AUDIT_ACTIONS);
export const auditOutcomeEnum = pgEnum('audit_outcome', AUDIT_OUTCOMES);
export const seatingEventEnum = pgEnum('seating_event', SEATING_EVENTS);
export const seatingAnswerEnum = pgEnum('seating_answer', SEATING_ANSWERS);
export const radiographPreviewStatusEnum = pgEnum('radiograph_preview_status', RADIOGRAPH_PREVIEW_STATUSES);
export const impressionMethodEnum = pgEnum('impression_method', IMPRESSION_METHODS);
export const scanFileTypeEnum = pgEnum('scan_file_type', SCAN_FILE_TYPES);
export const dateFormatEnum = pgEnum('date_format', DATE_FORMATS);
