// The lot look-up in one statement: implants (placements, current version) and parts (component
// instances) of the practice whose lot, GTIN or catalogue part matches. Indexes used:
// placements_practice_lot_idx, placements_practice_gtin_idx, component_instances_practice_lot_idx,
// components_practice_reference_idx + component_instances_component_idx (see the EXPLAIN test).
import { sql, type SQL } from 'drizzle-orm';
import type { LotItemKind, LotLookupRow } from '@torquetrail/contracts';
import type { Db } from '../db/database.js';
import { partWasFittedSql } from '../db/parts-in-place.js';

/** What to match; null fields are not asked about. A UDI gives a GTIN and usually a lot. */
export interface LotCriteria {
  lot: string | null;
  gtin: string | null;
  part: string | null;
}

/** Most rows one look-up returns (a notice about one lot rarely reaches a hundred patients). */
const LOT_LOOKUP_MAX_ROWS = 5000;

/** The statement of a look-up (exported for the test that EXPLAINs it). */
export function lotLookupSql(practiceId: string, c: LotCriteria): SQL {
  const implantWhere: SQL[] = [sql`pl.practice_id = ${practiceId}`];
  if (c.lot !== null) implantWhere.push(sql`pl.lot = ${c.lot}`);
  if (c.gtin !== null) implantWhere.push(sql`pl.gtin = ${c.gtin}`);
  // A GTIN or a lot names implants; a catalogue part names only stack parts (the catalogue has no
  // reference code for an implant body), and a GTIN only implants (parts carry no GTIN here).
  const askImplants = c.part === null;
  const askParts = c.gtin === null && (c.lot !== null || c.part !== null);
  // A part entered in error was never in the mouth: it is no one's part to trace.
  const partWhere: SQL[] = [sql`ci.practice_id = ${practiceId}`, partWasFittedSql('ci')];
  if (c.lot !== null) partWhere.push(sql`ci.lot = ${c.lot}`);
  if (c.part !== null)
    partWhere.push(
      sql`ci.component_id in (select id from components where practice_id = ${practiceId} and reference_code = ${c.part})`,
    );
  const implants = sql`
    select pa.id as patient_id, pa.chart_number, pa.given_name || ' ' || pa.family_name as patient_name,
           s.id as site_id, s.fdi, 'implant' as item, null::text as component_kind,
           sy.name || ' ' || pf.name || ' × ' || pl.length_mm::text || ' mm' as part,
           null::text as reference_code, pl.gtin, pl.lot, pl.placed_on as installed_on,
           case when s.status in ('failed', 'removed') then coalesce(s.ended_on, pl.placed_on) end as removed_on
      from placements pl
      join implant_sites s on s.id = pl.site_id
      join patients pa on pa.id = pl.patient_id
      join platforms pf on pf.id = pl.platform_id
      join implant_systems sy on sy.id = pf.system_id
     where ${sql.join(implantWhere, sql` and `)}
       and not exists (select 1 from placements newer where newer.supersedes_id = pl.id)`;
  const parts = sql`
    select pa.id as patient_id, pa.chart_number, pa.given_name || ' ' || pa.family_name as patient_name,
           s.id as site_id, s.fdi, 'part' as item, co.kind::text as component_kind, co.name as part,
           co.reference_code, null::text as gtin, ci.lot, ci.installed_on, ci.removed_on
      from component_instances ci
      join components co on co.id = ci.component_id
      join implant_sites s on s.id = ci.site_id
      join patients pa on pa.id = ci.patient_id
     where ${sql.join(partWhere, sql` and `)}`;
  const union = askImplants && askParts ? sql`${implants} union all ${parts}` : askImplants ? implants : parts;
  return sql`select * from (${union}) found order by chart_number, fdi, installed_on limit ${LOT_LOOKUP_MAX_ROWS}`;
}

export async function lookUpLots(db: Db, practiceId: string, c: LotCriteria): Promise<LotLookupRow[]> {
  const result = await db.execute<{
    patient_id: string;
    chart_number: string;
    patient_name: string;
    site_id: string;
    fdi: number;
    item: LotItemKind;
    component_kind: LotLookupRow['componentKind'];
    part: string;
    reference_code: string | null;
    gtin: string | null;
    lot: string | null;
    installed_on: string;
    removed_on: string | null;
  }>(lotLookupSql(practiceId, c));
  return result.rows.map((r) => ({
    patientId: r.patient_id,
    chartNumber: r.chart_number,
    patientName: r.patient_name,
    siteId: r.site_id,
    fdi: r.fdi,
    item: r.item,
    componentKind: r.component_kind,
    part: r.part,
    referenceCode: r.reference_code,
    gtin: r.gtin,
    lot: r.lot,
    installedOn: r.installed_on,
    removedOn: r.removed_on,
    inPlace: r.removed_on === null,
  }));
}
