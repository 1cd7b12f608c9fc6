// The large practice of the benchmark: PATIENTS patients (10 000 by default) with 2.5 implants each
// on average and fifteen years of ledger, added to the demo practice of an already seeded database
// (so the demo's sites, the ones measured, sit in a practice of that size). Deterministic: every id
// is an md5 of the row's position and every value a function of it, so two runs write the same rows.
// Set-based SQL (INSERT … SELECT over generate_series) in one transaction: PostgreSQL makes the
// rows itself, nothing crosses the wire row by row. Invented data only (names are numbered).
import pgModule from 'pg';

/** One statement per table, in foreign-key order; `$1` is the practice, `$2` the number of patients. */
const STEPS = [
  [
    'patients',
    `insert into patients (id, practice_id, chart_number, given_name, family_name, birth_date, email, smoker, periodontitis_history, created_at)
     select b.uuid('p', g), $1, 'BL-' || lpad(g::text, 6, '0'), 'Given' || (g % 997), 'Family' || lpad((g * 7919 % 100000)::text, 5, '0'),
            date '1940-01-01' + (g * 13 % 18000), 'p' || g || '@bench.example', g % 5 = 0, g % 7 = 0, b.origin()
     from generate_series(1, $2) g`,
  ],
  // 1–4 implants per patient (2.5 on average), at four distinct positions; most restored.
  [
    'implant_sites',
    `insert into implant_sites (id, practice_id, patient_id, fdi, status, created_at)
     select b.uuid('s', g, k), $1, b.uuid('p', g), (array[16, 26, 36, 46])[k],
            (case when g % 40 = 0 then 'placed' else 'restored' end)::site_status, b.origin()
     from generate_series(1, $2) g cross join generate_series(1, 4) k
     where k <= 1 + (g * 7 % 4)`,
  ],
  [
    'bench_sites',
    `create temporary table bench_sites on commit drop as
     select g, k, b.uuid('s', g, k) as site_id, b.uuid('p', g) as patient_id, g % 40 <> 0 as restored,
            b.origin()::date + ((g * 37 + k * 101) % 5200) as placed_on,
            b.origin()::date + ((g * 37 + k * 101) % 5200) + 120 as delivered_on,
            p.platform_id, p.abutment_id, p.screw_id, p.spec
     from generate_series(1, $2) g cross join generate_series(1, 4) k
     join bench_platforms p on p.n = (g + k) % (select count(*) from bench_platforms)
     where k <= 1 + (g * 7 % 4)`,
  ],
  [
    'placements',
    `insert into placements (id, practice_id, patient_id, site_id, platform_id, placed_on, surgeon_name, length_mm, lot, insertion_torque_ncm, stability_isq, loading_protocol, recorded_at)
     select b.uuid('pl', g, k), $1, patient_id, site_id, platform_id, placed_on, 'Surgeon ' || (g % 9), 8 + (g % 4) * 1.5,
            'LOT-' || (g * 31 % 9999), 30 + (g % 20), 60 + (g % 20), 'conventional', placed_on::timestamptz
     from bench_sites`,
  ],
  // One placement in ten amended later (a corrected length).
  [
    'placements (amendments)',
    `insert into placements (id, practice_id, patient_id, site_id, platform_id, placed_on, surgeon_name, length_mm, lot, insertion_torque_ncm, stability_isq, loading_protocol, supersedes_id, amendment_reason, recorded_at)
     select b.uuid('pla', g, k), $1, patient_id, site_id, platform_id, placed_on, 'Surgeon ' || (g % 9), 10, 'LOT-' || (g * 31 % 9999),
            30 + (g % 20), 60 + (g % 20), 'conventional', b.uuid('pl', g, k), 'Length corrected from the chart', placed_on::timestamptz + interval '2 days'
     from bench_sites where (g + k) % 10 = 0`,
  ],
  [
    'restorations',
    `insert into restorations (id, practice_id, patient_id, kind, retention, material, status, delivered_on, planned_by, created_at)
     select b.uuid('r', g, k), $1, patient_id, 'single-crown', 'screw-to-implant', 'zirconia', 'delivered', delivered_on, b.user_id('dentist'), placed_on::timestamptz + interval '60 days'
     from bench_sites where restored`,
  ],
  [
    'restorations (amendments)',
    `insert into restorations (id, practice_id, patient_id, kind, retention, material, shade, status, delivered_on, planned_by, supersedes_id, amendment_reason, created_at)
     select b.uuid('ra', g, k), $1, patient_id, 'single-crown', 'screw-to-implant', 'zirconia', 'A2', 'delivered', delivered_on, b.user_id('dentist'),
            b.uuid('r', g, k), 'Shade recorded', placed_on::timestamptz + interval '61 days'
     from bench_sites where restored and (g + k) % 12 = 0`,
  ],
  [
    'restoration_sites',
    `insert into restoration_sites (id, practice_id, restoration_id, site_id, interface, impression_coping)
     select b.uuid('rs', r.id), $1, r.id, s.site_id, 'engaging', 'engaging'
     from bench_sites s join restorations r on r.id in (b.uuid('r', s.g, s.k), b.uuid('ra', s.g, s.k))`,
  ],
  // An abutment and its screw per restored site; one screw in fifteen replaced years later.
  [
    'component_instances',
    `insert into component_instances (id, practice_id, patient_id, site_id, restoration_id, component_id, lot, installed_on, removed_on, recorded_by, recorded_at)
     select b.uuid(part, g, k), $1, patient_id, site_id, b.uuid('r', g, k), case part when 'ab' then abutment_id else screw_id end,
            'L' || g, delivered_on, case when part = 'sc' and (g + k) % 15 = 0 then delivered_on + 1500 end,
            b.user_id('dentist'), delivered_on::timestamptz
     from bench_sites cross join (values ('ab'), ('sc')) parts(part) where restored`,
  ],
  [
    'component_instances (replacement screws)',
    `insert into component_instances (id, practice_id, patient_id, site_id, restoration_id, component_id, lot, installed_on, replaces_id, recorded_by, recorded_at)
     select b.uuid('sc2', g, k), $1, patient_id, site_id, b.uuid('r', g, k), screw_id, 'L2-' || g, delivered_on + 1500, b.uuid('sc', g, k),
            b.user_id('dentist'), (delivered_on + 1500)::timestamptz
     from bench_sites where restored and (g + k) % 15 = 0`,
  ],
  // Seating, re-torque after settling, then a re-torque at every other yearly recall.
  [
    'torque_events',
    `insert into torque_events (id, practice_id, patient_id, component_instance_id, applied_ncm, spec_ncm, tolerance_pct, verdict, rules_version, reason, wrench_id, performed_at, recorded_by, recorded_at)
     select b.uuid('te', ci.id, n), $1, ci.patient_id, ci.id, s.spec + ((n % 3) - 1) * 0.5, s.spec, 10, 'within', 'bench',
            (case when n = 0 and ci.replaces_id is null then 'initial-seating' when n = 0 then 'screw-replaced'
                  when n = 1 then 're-torque-after-settling' else 're-torque-at-recall' end)::torque_reason,
            b.wrench_id(), (ci.installed_on + case when n = 0 then 0 when n = 1 then 14 else (n - 1) * 730 end)::timestamptz + interval '10 hours',
            b.user_id('dentist'), (ci.installed_on + case when n = 0 then 0 when n = 1 then 14 else (n - 1) * 730 end)::timestamptz + interval '11 hours'
     from component_instances ci join bench_sites s on s.site_id = ci.site_id and ci.component_id = s.screw_id
     cross join generate_series(0, 8) n
     where ci.practice_id = $1 and ci.lot like 'L%'
       and ci.installed_on + case when n = 0 then 0 when n = 1 then 14 else (n - 1) * 730 end < least(coalesce(ci.removed_on, current_date), current_date)`,
  ],
  [
    'torque_events (amendments)',
    `insert into torque_events (id, practice_id, patient_id, component_instance_id, applied_ncm, spec_ncm, tolerance_pct, verdict, rules_version, reason, wrench_id, performed_at, supersedes_id, amendment_reason, recorded_by, recorded_at)
     select b.uuid('tea', t.id), $1, t.patient_id, t.component_instance_id, t.spec_ncm, t.spec_ncm, t.tolerance_pct, 'within', 'bench', t.reason, t.wrench_id,
            t.performed_at, t.id, 'Wrench reading re-entered', b.user_id('dentist'), t.recorded_at + interval '1 hour'
     from torque_events t where t.practice_id = $1 and t.rules_version = 'bench' and get_byte(decode(md5(t.id::text), 'hex'), 0) < 10`,
  ],
  [
    'complications',
    `insert into complications (id, practice_id, patient_id, site_id, component_instance_id, kind, occurred_on, notes, recorded_by, recorded_at)
     select b.uuid('co', g, k), $1, patient_id, site_id, b.uuid('sc', g, k), 'screw-loosening', delivered_on + 400, 'Found loose at recall',
            b.user_id('dentist'), (delivered_on + 400)::timestamptz
     from bench_sites where restored and (g * 3 + k) % 20 = 0 and delivered_on + 400 < current_date`,
  ],
  [
    'complications (amendments)',
    `insert into complications (id, practice_id, patient_id, site_id, component_instance_id, kind, occurred_on, notes, supersedes_id, amendment_reason, recorded_by, recorded_at)
     select b.uuid('coa', c.id), $1, c.patient_id, c.site_id, c.component_instance_id, c.kind, c.occurred_on, 'Found loose at recall; retightened',
            c.id, 'Note completed', c.recorded_by, c.recorded_at + interval '1 day'
     from complications c where c.practice_id = $1 and c.notes = 'Found loose at recall' and get_byte(decode(md5(c.id::text), 'hex'), 0) < 51`,
  ],
  // A recall exam per restored site and year since delivery; a few with peri-implantitis.
  [
    'recall_exams',
    `insert into recall_exams (id, practice_id, patient_id, site_id, visit_id, examined_on, examiner_id, mobility, plaque_index, bleeding_index, bone_level_mm, is_baseline, status, reasons, flags, rules_version, rule_options, recorded_at)
     select b.uuid('ex', g, k, n), $1, patient_id, site_id, b.uuid('vi', g, n), delivered_on + 365 * n, b.user_id('hygienist'), false, (g + n) % 3, (g + n) % 2,
            case when n = 0 then 0.5 else 0.5 + n * 0.1 end, n = 0,
            (case when (g * 11 + k * 5 + n) % 53 = 0 then 'peri-implantitis' when (g + k + n) % 9 = 0 then 'mucositis' else 'health' end)::peri_implant_status,
            '[]'::jsonb, '[]'::jsonb, 'bench', '{}'::jsonb, (delivered_on + 365 * n)::timestamptz + interval '9 hours'
     from bench_sites cross join generate_series(0, 14) n
     where restored and delivered_on + 365 * n <= current_date`,
  ],
  [
    'recall_exams (amendments)',
    `insert into recall_exams (id, practice_id, patient_id, site_id, visit_id, examined_on, examiner_id, mobility, plaque_index, bleeding_index, bone_level_mm, is_baseline, status, reasons, flags, rules_version, rule_options, supersedes_id, amendment_reason, recorded_at)
     select b.uuid('exa', e.id), $1, e.patient_id, e.site_id, e.visit_id, e.examined_on, e.examiner_id, e.mobility, e.plaque_index, e.bleeding_index,
            e.bone_level_mm, e.is_baseline, e.status, e.reasons, e.flags, e.rules_version, e.rule_options, e.id, 'Probing re-entered', e.recorded_at + interval '1 hour'
     from recall_exams e where e.practice_id = $1 and e.rules_version = 'bench' and get_byte(decode(md5(e.id::text), 'hex'), 0) < 8`,
  ],
  [
    'recall_exam_sites',
    `insert into recall_exam_sites (id, practice_id, exam_id, position, probing_depth_mm, bleeding, suppuration)
     select b.uuid('es', e.id, pos::text), $1, e.id, pos, 2 + (get_byte(decode(md5(e.id::text || pos::text), 'hex'), 0) % 4) * 0.5,
            e.bleeding_index > 0 and pos in ('buccal', 'lingual'), e.status = 'peri-implantitis' and pos = 'buccal'
     from recall_exams e cross join unnest(enum_range(null::probing_site)) pos
     where e.practice_id = $1 and e.rules_version = 'bench'`,
  ],
  // Each patient's yearly recalls, done, and the next one scheduled (90 days overdue to 180 ahead).
  [
    'recalls',
    `insert into recalls (id, practice_id, patient_id, due_on, status, created_at)
     select b.uuid('rc', g, n), $1, b.uuid('p', g), current_date - 365 * n + ((g * 97 % 271) - 90),
            (case when n = 0 then 'scheduled' else 'done' end)::recall_status, b.origin()
     from generate_series(1, $2) g cross join generate_series(0, 8) n
     where n <= 1 + g % 8`,
  ],
  // A periapical at placement and at delivery, then every third year; a panoramic every fifth.
  [
    'radiographs',
    `insert into radiographs (id, practice_id, patient_id, object_key, size_bytes, sha256, file_type, kind, taken_on, rows, columns, preview_status, uploaded_by, uploaded_at)
     select b.uuid('rg', g, k, n), $1, patient_id, 'bench/' || b.uuid('rg', g, k, n), 48000, md5('rg' || g || '-' || k || '-' || n) || md5('x' || g || k || n),
            'png', 'periapical', d, 640, 480, 'ready', b.user_id('dentist'), d::timestamptz + interval '12 hours'
     from bench_sites cross join generate_series(0, 5) n
     cross join lateral (select case when n = 0 then placed_on else delivered_on + greatest(n - 1, 0) * 1095 end as d) day
     where (n = 0 or restored) and d <= current_date`,
  ],
  [
    'radiograph_sites',
    `insert into radiograph_sites (radiograph_id, site_id)
     select b.uuid('rg', g, k, n), site_id from bench_sites cross join generate_series(0, 5) n
     where (n = 0 or restored) and (case when n = 0 then placed_on else delivered_on + greatest(n - 1, 0) * 1095 end) <= current_date`,
  ],
];

/**
 * `b.uuid(a, b, …)` in the statements stands for a deterministic id made of its parts (numbers,
 * texts or ids alike): an md5 of them joined, read as a uuid. Expanded here because a SQL function
 * cannot take arguments of mixed types.
 */
function expandIds(statement) {
  let out = '';
  let i = 0;
  for (let at = statement.indexOf('b.uuid(', i); at !== -1; at = statement.indexOf('b.uuid(', i)) {
    let depth = 0;
    let end = at + 'b.uuid'.length;
    for (; end < statement.length; end += 1) {
      if (statement[end] === '(') depth += 1;
      else if (statement[end] === ')' && --depth === 0) break;
    }
    const args = statement.slice(at + 'b.uuid('.length, end);
    out += `${statement.slice(i, at)}md5(concat_ws('/', 'torquetrail-bench', ${args}))::uuid`;
    i = end + 1;
  }
  return out + statement.slice(i);
}

/** Helper functions and the catalogue the rows draw on, in a schema dropped at the end. */
const SETUP = `
  create schema b;
  create function b.origin() returns timestamptz language sql stable as $$ select (current_date - 5475)::timestamptz $$;
  create table b.refs (key text primary key, id uuid not null);
`;

/** Adds the large practice to the demo practice of `connectionString` (the owner's). Returns row counts and seconds. */
export async function seedLargePractice(connectionString, { patients = 10_000, log = () => {} } = {}) {
  const client = new pgModule.Client({ connectionString });
  await client.connect();
  const started = performance.now();
  const counts = {};
  try {
    await client.query('begin');
    // The rows are consistent by construction (every reference is to a row written before it), so
    // the row-by-row foreign-key triggers are skipped for this transaction: they doubled its time.
    // Needs the owner to be a superuser, as the local cluster's is; elsewhere the checks simply run.
    const [{ superuser }] = (
      await client.query(`select rolsuper as superuser from pg_roles where rolname = current_user`)
    ).rows;
    if (superuser) await client.query(`set local session_replication_role = replica`);
    await client.query(`set local work_mem = '64MB'`);
    await client.query(SETUP);
    const [{ id: practiceId }] = (
      await client.query(`select practice_id as id from patients where chart_number = 'LL-1001'`)
    ).rows;
    await client.query(
      `insert into b.refs select 'dentist', id from users where practice_id = $1 and role = 'dentist' order by email limit 1;
       insert into b.refs select 'hygienist', id from users where practice_id = $1 and role = 'hygienist' order by email limit 1;
       insert into b.refs select 'wrench', id from torque_wrenches w where practice_id = $1
         and not exists (select 1 from torque_wrenches n where n.supersedes_id = w.id) order by label limit 1`.replaceAll(
        '$1',
        `'${practiceId}'`,
      ),
    );
    await client.query(`
      create function b.user_id(role text) returns uuid language sql stable as $$ select id from b.refs where key = role $$;
      create function b.wrench_id() returns uuid language sql stable as $$ select id from b.refs where key = 'wrench' $$;`);
    // The practice's platforms with a current stock abutment and abutment screw each.
    await client.query(
      `create temporary table bench_platforms on commit drop as
       select (row_number() over (order by pl.name, pl.id) - 1)::int as n, pl.id as platform_id, ab.id as abutment_id, sc.id as screw_id, sc.torque_spec_ncm as spec
       from platforms pl
       join lateral (select id from components c where c.platform_id = pl.id and c.kind = 'abutment-stock'
         and not exists (select 1 from components x where x.supersedes_id = c.id) limit 1) ab on true
       join lateral (select id, torque_spec_ncm from components c where c.platform_id = pl.id and c.kind = 'abutment-screw'
         and c.torque_spec_ncm is not null and not exists (select 1 from components x where x.supersedes_id = c.id) limit 1) sc on true
       where pl.practice_id = $1`,
      [practiceId],
    );
    for (const [name, statement] of STEPS) {
      const t = performance.now();
      // The two values are ours (a uuid read above, a number): written into the text, typed by PostgreSQL.
      const sql = expandIds(statement)
        .replaceAll('$1', `'${practiceId}'::uuid`)
        .replaceAll('$2', String(Math.trunc(patients)));
      const result = await client.query(sql);
      if (result.rowCount !== null) counts[name] = result.rowCount;
      log(
        `  ${name.padEnd(42)} ${String(result.rowCount ?? '').padStart(8)} rows ${((performance.now() - t) / 1000).toFixed(1)} s`,
      );
    }
    await client.query('drop schema b cascade');
    {
      // The Recall desk's summary (ADR 0009): its triggers do not fire in replica mode, so the
      // practice's rows are computed once here, as the migration does for an existing database.
      const t = performance.now();
      await client.query(
        `select public.recall_summary_refresh(array(select id from patients where practice_id = $1))`,
        [practiceId],
      );
      log(
        `  ${'recall_summaries'.padEnd(42)} ${String(patients).padStart(8)} rows ${((performance.now() - t) / 1000).toFixed(1)} s`,
      );
    }
    await client.query('commit');
    await client.query('analyze');
    // The desk's summary was written twice a row (inserted, then filled): vacuumed, so the desk's
    // counts read its indexes only (a practice's own autovacuum does this over time).
    await client.query('vacuum analyze recall_summaries');
  } catch (error) {
    await client.query('rollback').catch(() => {});
    throw error;
  } finally {
    await client.end();
  }
  return { counts, seconds: (performance.now() - started) / 1000 };
}
