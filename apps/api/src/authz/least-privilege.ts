// The reply a surgeon receives about a patient shared with them (issue 12), built from the
// reply the route would give the patient's own practice: every object of the reply that belongs
// to a shared patient keeps only the keys the share's CASL field rules permit on the route's
// subject (`readableFields`, i.e. `permittedFieldsOf`); an object of a site the share does not open,
// or dated after the share's last day, is left out of its list. Nested objects are judged like their
// parents (the patient and the site they sit under), so a list, a nested list and a one-row reply
// go through the same rule. Objects of the user's own practice pass whole.
import { type ActiveShare, type AppAbility, readableFields, type Subject, subject } from '@torquetrail/authz';

export interface ReplyScope {
  ability: AppAbility;
  shares: readonly ActiveShare[];
  /** The route's subject (its `@Allow('read', …)`). */
  type: Exclude<Subject, 'all'>;
  /** The patient the request opened, for replies whose rows do not name their patient. */
  openedPatientId: string | undefined;
}

/** The shares of one patient added up: the union of their sites, the latest last day. */
interface PatientShare {
  siteIds: readonly string[] | null;
  endsOn: string | null;
}

/** Keys holding the day an entry happened: an entry after the share's last day is not served. */
const DATED_BY = [
  'at',
  'placedOn',
  'installedOn',
  'performedAt',
  'examinedOn',
  'takenOn',
  'measuredAt',
  'recordedAt',
  'uploadedAt',
  'createdAt',
  'impressionTakenOn',
  'deliveredOn',
  'requestedAt',
  'sentAt',
] as const;

const LEFT_OUT = Symbol('left out');
type Walked = unknown;

interface At {
  patientId: string | undefined;
  siteId: string | undefined;
  /** The reply itself or one of its `items`: a row of the route's subject. */
  row: boolean;
}

function sharesByPatient(shares: readonly ActiveShare[]): Map<string, PatientShare> {
  const byPatient = new Map<string, PatientShare>();
  for (const share of shares) {
    const before = byPatient.get(share.patientId);
    const endsOn = share.endsOn ?? null;
    if (!before) {
      byPatient.set(share.patientId, { siteIds: share.siteIds, endsOn });
      continue;
    }
    byPatient.set(share.patientId, {
      siteIds: before.siteIds && share.siteIds ? [...new Set([...before.siteIds, ...share.siteIds])] : null,
      endsOn: before.endsOn && endsOn ? (before.endsOn > endsOn ? before.endsOn : endsOn) : null,
    });
  }
  return byPatient;
}

const isPlainObject = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' &&
  value !== null &&
  (Object.getPrototypeOf(value) === Object.prototype || Object.getPrototypeOf(value) === null);

const text = (value: unknown): string | undefined => (typeof value === 'string' ? value : undefined);

/** The reply with every part of a shared patient reduced to what the share opens. */
export function leastPrivilege(reply: unknown, scope: ReplyScope): unknown {
  const shares = sharesByPatient(scope.shares);
  const { ability, type } = scope;
  const siteReadable = (patientId: string, siteId: string) =>
    ability.can('read', subject('ImplantSite', { patientId, id: siteId, siteId }));

  function walk(value: unknown, at: At): Walked {
    if (Array.isArray(value)) {
      return value.map((v: unknown) => walk(v, at)).filter((v) => v !== LEFT_OUT);
    }
    // Files, streams and dates pass as they are: only the plain JSON of a reply is judged.
    if (!isPlainObject(value)) return value;
    const node = value;
    const patientId = text(node.patientId) ?? (at.row && type === 'Patient' ? text(node.id) : at.patientId);
    const share = patientId ? shares.get(patientId) : undefined;
    if (patientId && !share) return node;
    if (!patientId || !share) return descend(node, at);
    const siteId = text(node.siteId) ?? (at.row && type === 'ImplantSite' ? text(node.id) : at.siteId);
    const ownSite = text(node.siteId);
    if (ownSite && !siteReadable(patientId, ownSite)) return LEFT_OUT;
    if (share.endsOn && DATED_BY.some((key) => (text(node[key])?.slice(0, 10) ?? '') > share.endsOn!)) return LEFT_OUT;
    // A row that names no site (a bridge, a patient-wide list) was limited to the shared sites in
    // SQL; it is judged as on the first of them.
    const judgedSite = siteId ?? share.siteIds?.[0];
    const fields = readableFields(ability, type, {
      id: type === 'Patient' ? patientId : judgedSite,
      patientId,
      siteId: judgedSite,
      kind: text(node.kind),
    });
    if (fields === null) return node;
    if (fields.length === 0) return LEFT_OUT;
    const kept: Record<string, unknown> = {};
    for (const [key, v] of Object.entries(node)) {
      if (fields.includes(`${key}.*`)) kept[key] = v;
      else if (!fields.includes(key)) continue;
      else if (key === 'siteIds' && Array.isArray(v))
        kept[key] = v.filter((id: unknown) => typeof id === 'string' && siteReadable(patientId, id));
      else {
        const walked = walk(v, { patientId, siteId, row: at.row && key === 'items' });
        kept[key] = walked === LEFT_OUT ? null : walked;
      }
    }
    return kept;
  }

  /** An object that belongs to no one patient (a list's envelope, an aggregate): its parts are judged. */
  function descend(node: Record<string, unknown>, at: At): Record<string, unknown> {
    const out: Record<string, unknown> = {};
    for (const [key, v] of Object.entries(node)) {
      const walked = walk(v, { ...at, row: at.row && key === 'items' });
      out[key] = walked === LEFT_OUT ? null : walked;
    }
    return out;
  }

  const walked = walk(reply, { patientId: scope.openedPatientId, siteId: undefined, row: true });
  return walked === LEFT_OUT ? {} : walked;
}
