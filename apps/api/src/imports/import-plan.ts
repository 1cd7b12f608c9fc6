// Turns the checked rows of a file into what they would write, row by row in file order, against
// the practice's records (patients, catalogue, live sites, parts, exams) and the rows before them.
// The dry run reports the outcome; the import writes it. Verdicts and statuses are computed here
// with the domain's rules and RULES_VERSION, never read from the file.
import { randomUUID } from 'node:crypto';
import type { ImportCounts, ImportIssue, ImportPartMapping, ImportRow } from '@torquetrail/contracts';
import { RULES_VERSION, torqueVerdict } from '@torquetrail/domain';
import type { DatePrinter } from '../common/printed-dates.js';
import type * as repo from './imports.repository.js';
import { FilePatients } from './file-patients.js';
import { judgeExamRow, RULE_OPTIONS, type ExamState } from './exam-row.js';
import { key, RowError } from './import-row.js';

type Loaded<K extends keyof typeof repo> = Awaited<ReturnType<(typeof repo)[K]>>;
type Part = Loaded<'currentParts'>[number];

export interface PlanContext {
  practiceId: string;
  userId: string;
  /** The latest date any clinic can call today (UTC+14): later dates cannot have happened. */
  latestToday: string;
  /** Dates quoted in the row messages, in the importing user's practice's order (issue 15 §7). */
  dates: DatePrinter;
  patients: Loaded<'practicePatients'>;
  platforms: Loaded<'practicePlatforms'>;
  parts: Part[];
  sites: Loaded<'liveSites'>;
  installed: Loaded<'installedParts'>;
  exams: Loaded<'examsOfSites'>;
  mappings: ImportPartMapping[];
}

interface SiteState {
  id: string;
  status: string;
  deliveredOn: string | null;
  placedOn: string | null;
  restorationId: string | null;
  /** The site's insert when the file creates it (its status follows the file's rows). */
  insert: repo.NewSite | null;
}

export class ImportPlanner {
  readonly issues: ImportIssue[] = [];
  readonly counts: ImportCounts = {
    rows: 0,
    patientsNew: 0,
    patientsMatched: 0,
    sites: 0,
    placement: 0,
    delivery: 0,
    part: 0,
    torque: 0,
    exam: 0,
  };
  readonly unknownParts = new Map<string, { partRef: string; partName: string | null; rows: number[] }>();
  readonly writes: repo.ImportWrites = {
    patients: [],
    patientVersions: [],
    sites: [],
    siteStatus: [],
    placements: [],
    restorations: [],
    restorationSites: [],
    instances: [],
    torque: [],
    exams: [],
    examSites: [],
    freeTextParts: [],
    entries: [],
  };

  private readonly patients: FilePatients;
  /** The patients the file touches, for the result's links (id → chart and name). */
  get touched() {
    return this.patients.touched;
  }
  private readonly platforms = new Map<string, string>();
  private readonly parts = new Map<string, Part>();
  private readonly partsById = new Map<string, Part>();
  private readonly mappings = new Map<string, ImportPartMapping>();
  private readonly sites = new Map<string, SiteState>();
  /** Site id → parts in the mouth there: catalogue lineage → instance id (the latest installed). */
  private readonly installed = new Map<string, Map<string, string>>();
  private readonly exams = new Map<string, ExamState[]>();
  private readonly visits = new Map<string, string>();
  /** Bridges begun by an earlier delivery row: patient, date, kind and restoration_ref → its restoration. */
  /** Set by a delivery row that added its site to a bridge begun on an earlier row. */
  private joinedBridge = false;
  private readonly bridges = new Map<
    string,
    { id: string; row: number; retention: string; material: string; siteIds: Set<string> }
  >();

  constructor(private readonly ctx: PlanContext) {
    this.patients = new FilePatients(ctx.patients, ctx, this);
    for (const p of ctx.platforms) this.platforms.set(key(p.systemName, p.name), p.id);
    for (const p of ctx.parts) {
      this.parts.set(key(p.referenceCode), p);
      this.partsById.set(p.id, p);
    }
    for (const m of ctx.mappings) this.mappings.set(key(m.partRef), m);
    for (const s of ctx.sites)
      this.sites.set(key(s.patientId, s.fdi), {
        id: s.id,
        status: s.status,
        deliveredOn: s.deliveredOn,
        placedOn: null,
        restorationId: null,
        insert: null,
      });
    for (const i of ctx.installed) this.instancesAt(i.siteId).set(i.lineageId, i.id);
    for (const e of ctx.exams) this.examsAt(e.siteId).push({ ...e, sites: [...e.sites] });
  }

  private instancesAt(siteId: string) {
    let m = this.installed.get(siteId);
    if (!m) this.installed.set(siteId, (m = new Map()));
    return m;
  }
  private examsAt(siteId: string) {
    let list = this.exams.get(siteId);
    if (!list) this.exams.set(siteId, (list = []));
    return list;
  }

  error(row: number, column: string | null, message: string) {
    this.issues.push({ row, column, level: 'error', message });
  }
  warning(row: number, column: string | null, message: string) {
    this.issues.push({ row, column, level: 'warning', message });
  }

  /** Checks one read row against the records and the rows before it; records what it would write. */
  add(rowNumber: number, row: ImportRow) {
    try {
      if (row.date > this.ctx.latestToday) throw new RowError('date', 'The date is in the future');
      if (row.date < row.birthDate) throw new RowError('date', 'The date is before the patient was born');
      const patient = this.patients.of(rowNumber, row);
      this.joinedBridge = false;
      this.event(rowNumber, row, patient.patientId);
      this.patients.create(rowNumber, patient);
      // A bridge's further sites join its restoration: `delivery` counts restorations, not rows.
      if (!this.joinedBridge) this.counts[row.event]++;
    } catch (e) {
      if (!(e instanceof RowError)) throw e;
      this.error(rowNumber, e.column, e.message);
    }
  }

  /** Links a written record to the file row it came from. */
  entry(rowNumber: number, recordTable: string, recordId: string) {
    this.writes.entries.push({ practiceId: this.ctx.practiceId, rowNumber, recordTable, recordId });
  }

  private siteFor(row: ImportRow, patientId: string): SiteState {
    const site = this.sites.get(key(patientId, row.fdi));
    if (!site || site.status === 'planned')
      throw new RowError('fdi', `No implant recorded at ${row.fdi} for this patient: put its placement row first`);
    return site;
  }

  private event(rowNumber: number, row: ImportRow, patientId: string) {
    const practiceId = this.ctx.practiceId;
    switch (row.event) {
      case 'placement': {
        const platformId = this.platforms.get(key(row.system, row.platform));
        if (!platformId)
          throw new RowError('platform', `${row.system} ${row.platform} is not a platform of the practice catalogue`);
        const siteKey = key(patientId, row.fdi);
        let site = this.sites.get(siteKey);
        if (site && site.status !== 'planned')
          throw new RowError('fdi', `This patient already has an implant (${site.status}) at ${row.fdi}`);
        if (!site) {
          const insert: repo.NewSite = { id: randomUUID(), practiceId, patientId, fdi: row.fdi, status: 'placed' };
          site = {
            id: insert.id,
            status: 'placed',
            deliveredOn: null,
            placedOn: row.date,
            restorationId: null,
            insert,
          };
          this.sites.set(siteKey, site);
          this.writes.sites.push(insert);
          this.entry(rowNumber, 'implant_sites', site.id);
          this.counts.sites++;
        } else {
          site.status = 'placed';
          site.placedOn = row.date;
          this.writes.siteStatus.push({ id: site.id, status: 'placed' });
        }
        const id = randomUUID();
        this.writes.placements.push({
          id,
          practiceId,
          patientId,
          siteId: site.id,
          platformId,
          placedOn: row.date,
          surgeonName: row.surgeon ?? 'imported record',
          lengthMm: row.lengthMm,
          lot: row.lot,
          insertionTorqueNcm: row.insertionTorqueNcm,
          notes: row.notes,
          recordedBy: this.ctx.userId,
        });
        this.entry(rowNumber, 'placements', id);
        return;
      }
      case 'delivery': {
        const site = this.siteFor(row, patientId);
        if (site.placedOn && row.date < site.placedOn)
          throw new RowError('date', `Delivered before the implant was placed (${this.ctx.dates.date(site.placedOn)})`);
        // Delivery rows of one bridge (docs/import.md, "Bridges") share one restoration.
        const bridgeKey =
          row.restorationKind === 'single-crown'
            ? null
            : key(patientId, row.date, row.restorationKind, row.restorationRef ?? '');
        const bridge = bridgeKey ? this.bridges.get(bridgeKey) : undefined;
        if (bridge) {
          if (bridge.retention !== row.retention || bridge.material !== row.material)
            throw new RowError(
              bridge.retention !== row.retention ? 'retention' : 'material',
              `Row ${bridge.row} starts this ${row.restorationKind} on ${this.ctx.dates.date(row.date)} with another retention or material: give each bridge its own restoration_ref`,
            );
          if (bridge.siteIds.has(site.id))
            throw new RowError('fdi', `Site ${row.fdi} is already part of this restoration (row ${bridge.row})`);
        }
        const id = bridge?.id ?? randomUUID();
        const restorationSiteId = randomUUID();
        this.writes.restorationSites.push({
          id: restorationSiteId,
          practiceId,
          restorationId: id,
          siteId: site.id,
          interface: row.interface,
          impressionCoping: row.interface,
        });
        this.restored(site, id, row.date);
        if (bridge) {
          bridge.siteIds.add(site.id);
          this.entry(rowNumber, 'restoration_sites', restorationSiteId);
          this.joinedBridge = true;
          return;
        }
        if (bridgeKey)
          this.bridges.set(bridgeKey, {
            id,
            row: rowNumber,
            retention: row.retention,
            material: row.material,
            siteIds: new Set([site.id]),
          });
        this.writes.restorations.push({
          id,
          practiceId,
          patientId,
          kind: row.restorationKind,
          retention: row.retention,
          material: row.material,
          status: 'delivered',
          deliveredOn: row.date,
          plannedBy: this.ctx.userId,
          rulesVersion: RULES_VERSION,
          // The file has no planning date: the plan's Timeline entry sits on the delivery day.
          createdAt: new Date(`${row.date}T00:00:00.000Z`),
          notes: row.notes,
        });
        this.entry(rowNumber, 'restorations', id);
        return;
      }
      case 'part': {
        const site = this.siteFor(row, patientId);
        const part = this.partOf(rowNumber, row.partRef, row.partName);
        if (part === 'free-text') {
          const id = randomUUID();
          this.writes.freeTextParts.push({
            id,
            practiceId,
            patientId,
            siteId: site.id,
            partRef: row.partRef,
            partName: row.partName,
            lot: row.lot,
            installedOn: row.date,
          });
          this.entry(rowNumber, 'imported_free_text_parts', id);
          return;
        }
        if (part.requiresLot && !row.lot) throw new RowError('lot', `The lot number of the ${part.name} is required`);
        const id = randomUUID();
        this.writes.instances.push({
          id,
          practiceId,
          patientId,
          siteId: site.id,
          restorationId: site.restorationId,
          componentId: part.id,
          lot: row.lot,
          installedOn: row.date,
          recordedBy: this.ctx.userId,
        });
        this.entry(rowNumber, 'component_instances', id);
        this.instancesAt(site.id).set(part.lineageId, id);
        return;
      }
      case 'torque': {
        const site = this.siteFor(row, patientId);
        const part = this.partOf(rowNumber, row.partRef, null);
        if (part === 'free-text')
          throw new RowError(
            'part_ref',
            `${row.partRef} is kept as free text: map it to a catalogue part to judge its torque`,
          );
        const instanceId = this.instancesAt(site.id).get(part.lineageId);
        if (!instanceId)
          throw new RowError(
            'part_ref',
            `No ${part.name} (${part.referenceCode}) is installed at ${row.fdi}: put its part row first`,
          );
        if (part.torqueSpecNcm === null)
          throw new RowError('part_ref', `The ${part.name} is hand-tight in the catalogue: it has no torque to judge`);
        const id = randomUUID();
        this.writes.torque.push({
          id,
          practiceId,
          patientId,
          componentInstanceId: instanceId,
          appliedNcm: row.torqueNcm,
          specNcm: part.torqueSpecNcm,
          tolerancePct: part.tolerancePct,
          verdict: torqueVerdict({
            appliedNcm: row.torqueNcm,
            specNcm: part.torqueSpecNcm,
            tolerancePct: part.tolerancePct,
          }),
          rulesVersion: RULES_VERSION,
          reason: row.torqueReason,
          performedAt: new Date(`${row.date}T00:00:00.000Z`),
          recordedBy: this.ctx.userId,
        });
        this.entry(rowNumber, 'torque_events', id);
        return;
      }
      case 'exam': {
        const site = this.siteFor(row, patientId);
        const earlier = this.examsAt(site.id);
        const { exam, probes, baseline, verdict } = judgeExamRow(row, earlier, site.deliveredOn);
        const id = randomUUID();
        const visitKey = key(patientId, row.date);
        let visitId = this.visits.get(visitKey);
        if (!visitId) this.visits.set(visitKey, (visitId = randomUUID()));
        this.writes.exams.push({
          id,
          practiceId,
          patientId,
          siteId: site.id,
          visitId,
          examinedOn: row.date,
          examinerId: this.ctx.userId,
          mobility: row.mobility,
          boneLevelMm: row.boneLevelMm,
          notes: row.notes,
          status: verdict.status,
          reasons: verdict.reasons,
          flags: verdict.flags,
          rulesVersion: RULES_VERSION,
          ruleOptions: RULE_OPTIONS,
          baselineExamId: baseline?.id ?? null,
        });
        for (const p of probes) this.writes.examSites.push({ practiceId, examId: id, ...p });
        this.entry(rowNumber, 'recall_exams', id);
        earlier.push({ id, ...exam, recordedAt: new Date(), boneLevelMm: row.boneLevelMm, sites: probes });
        return;
      }
    }
  }

  /** The site now carries the restoration: parts installed after it are linked to it. */
  private restored(site: SiteState, restorationId: string, deliveredOn: string) {
    site.restorationId = restorationId;
    site.deliveredOn = deliveredOn;
    if (site.status !== 'restored') {
      site.status = 'restored';
      if (site.insert) site.insert.status = 'restored';
      else this.writes.siteStatus.push({ id: site.id, status: 'restored' });
    }
  }

  /** The catalogue parts an unknown reference may be mapped to. */
  catalogueParts() {
    return this.ctx.parts.map((p) => ({
      id: p.id,
      referenceCode: p.referenceCode,
      name: p.name,
      platformName: p.platformName,
    }));
  }

  /** The catalogue part of a reference, through the user's mapping when it is not in the catalogue. */
  private partOf(rowNumber: number, partRef: string, partName: string | null): Part | 'free-text' {
    const found = this.parts.get(key(partRef));
    if (found) return found;
    const mapping = this.mappings.get(key(partRef));
    if (mapping && 'componentId' in mapping) {
      const mapped = this.partsById.get(mapping.componentId);
      if (mapped) return mapped;
      throw new RowError('part_ref', `${partRef} is mapped to a part that is not in the practice catalogue`);
    }
    if (mapping) return 'free-text';
    const unknown = this.unknownParts.get(key(partRef)) ?? { partRef, partName, rows: [] };
    unknown.partName ??= partName;
    unknown.rows.push(rowNumber);
    this.unknownParts.set(key(partRef), unknown);
    throw new RowError(
      'part_ref',
      `${partRef} is not in the practice catalogue: map it to a catalogue part or keep it as free text`,
    );
  }
}
