// Loads the benchmark database of `npm run bench:audit` with a million runs in minutes. Each published version of
// the starting standards is run once at its defaults through the run use case (the evaluation pool, the canonical
// record and its sha256, as a person's run is stored); those records are the templates. Every generated run copies
// one template's record with its own id, time, job and person written in (so records keep the starting standards'
// mix of sizes and each sha256 is that of its own text), in multi-row INSERT … SELECT over generate_series, two
// statements at a time (the machine has two cores). One run in 97 is stored as failed in the engine (its record's
// size is a succeeded one's: the lists read columns, not records); utilisations are spread so that about one in seven
// fails a check. One run in 40 is issued as a calc revision, signed off to each step in turn.
import { DEMO_JOBS, DEMO_USERS } from "@/db/demo-users";
import { runUseCase } from "@/lib/use-cases/run";
import { createRun } from "@/lib/use-cases/runs";
import { evaluationPool } from "@/lib/evaluation/pool";
import type { Bench } from "./bench-audit-sections";

const JOBS = 300;
const PEOPLE = 36;
const BATCH = 25_000;
const YEARS = 3;
/** The runs span the three years up to the load, none in the future (an export reads up to the moment it starts). */
const FIRST_DAY = new Date(Date.now() - YEARS * 365.25 * 86_400_000 - 120_000).toISOString();

// Invented names for the benchmark's people and jobs (never a real firm or person).
const GIVEN = [
  "Aldo",
  "Brigid",
  "Casimir",
  "Delphine",
  "Eamon",
  "Fenna",
  "Gideon",
  "Halla",
  "Ilsa",
  "Joris",
  "Kerensa",
  "Lorcan",
];
const FAMILY = ["Ashdown", "Brackwater", "Coldharbour"];
const PLACES = ["Mill Lane", "Harbour Row", "Tanner's Yard", "Orchard Rise", "Station Road", "Kiln Close", "Weir Street"];
const WORKS = ["warehouse", "footbridge", "school hall", "car park deck", "pavilion", "workshop", "canopy", "plant room"];

const say = (message: string) => console.log(`bench:audit: ${message}`);

/** The canonical JSON of an object whose keys are already in order and whose values are ASCII-safe strings. */
const canonical = (value: Record<string, string>) => JSON.stringify(value);

/**
 * How often each starting standard is run, in thousandths: single beams daily, frames less, the multi-storey frame
 * (a record of about 230 kB) now and then. Sets the mix of record sizes; a version not named shares the rest.
 */
const RUN_SHARE: Record<string, number> = {
  "fixed-end-beam": 200,
  "propped-cantilever": 150,
  "simply-supported-beam": 270,
  "two-span-beam": 150,
  "portal-frame": 100,
  "braced-bay": 100,
  "multi-storey-frame": 30,
};

/**
 * Runs each published version once at its defaults, and keeps each record cut around what differs from run to run
 * (its time, person, id and job, in the record's own key order), so a copy is a concatenation, not a search.
 */
async function makeTemplates(bench: Bench): Promise<number> {
  const engineerEmail = DEMO_USERS.find((u) => u.role === "engineer")!.email;
  const {
    rows: [engineer],
  } = await bench.app.query(`select id, name, email from "user" where email = $1`, [engineerEmail]);
  const {
    rows: [job],
  } = await bench.app.query(`select id from jobs where job_number = $1`, [DEMO_JOBS[0].jobNumber]);
  const { rows: versions } = await bench.app.query<{ id: string; slug: string; number: number }>(
    `select v.id, s.slug, v.number from standard_versions v join standards s on s.id = v.standard_id order by s.slug, v.number`,
  );
  const actor = { ...engineer, role: "engineer" as const };
  const templates: { versionId: string; parts: string[]; share: number; label: string; bytes: number }[] = [];
  for (const version of versions) {
    const run = await runUseCase(createRun, { actor, input: { jobId: job.id, versionId: version.id, inputs: {} } });
    if (run.outcome !== "succeeded") throw new Error(`${version.slug} v${version.number} failed at its defaults: ${run.message}`);
    const {
      rows: [{ record }],
    } = await bench.app.query<{ record: string }>(`select record from runs where id = $1`, [run.id]);
    const cuts = [
      /"createdAt":"[^"]+"/,
      new RegExp(`"createdBy":${escape(canonical({ id: engineer.id, name: engineer.name }))}`),
      new RegExp(`"id":"${run.id}"`),
      /"job":\{"id":"[^"]+","name":"(?:[^"\\]|\\.)*","number":"[^"]+"\}/,
    ];
    const parts: string[] = [];
    let rest = record;
    for (const cut of cuts) {
      const found = cut.exec(rest);
      if (!found) throw new Error(`the record of ${version.slug} v${version.number} has no ${cut.source} where expected`);
      parts.push(rest.slice(0, found.index));
      rest = rest.slice(found.index + found[0].length);
    }
    parts.push(rest);
    const sameVersions = versions.filter((v) => v.slug === version.slug).length;
    templates.push({
      versionId: version.id,
      parts,
      share: (RUN_SHARE[version.slug] ?? 50) / sameVersions,
      label: `${version.slug} v${version.number}`,
      bytes: Buffer.byteLength(record),
    });
  }
  await evaluationPool().close();
  await bench.owner.query(`drop table if exists bench_templates`);
  await bench.owner.query(
    `create unlogged table bench_templates (n int, version_id uuid, p0 text, p1 text, p2 text, p3 text, p4 text, lo float8, hi float8)`,
  );
  const total = templates.reduce((sum, t) => sum + t.share, 0);
  let lo = 0;
  let mean = 0;
  for (const [n, t] of templates.entries()) {
    const hi = lo + t.share / total;
    await bench.owner.query(`insert into bench_templates values ($1, $2, $3, $4, $5, $6, $7, $8, $9)`, [
      n,
      t.versionId,
      ...t.parts,
      lo,
      n === templates.length - 1 ? 1.01 : hi,
    ]);
    say(`template ${t.label}: record ${(t.bytes / 1024).toFixed(1)} kB, ${((100 * t.share) / total).toFixed(1)} % of runs`);
    mean += (t.bytes * t.share) / total;
    lo = hi;
  }
  say(`mean record ${(mean / 1024).toFixed(1)} kB`);
  return templates.length;
}

/** A string as a regular expression matching it literally. */
const escape = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

async function makePeopleAndJobs(bench: Bench): Promise<void> {
  const people = Array.from({ length: PEOPLE }, (_, n) => {
    const name = `${GIVEN[n % GIVEN.length]} ${FAMILY[Math.floor(n / GIVEN.length) % FAMILY.length]}`;
    const id = `bench-person-${String(n).padStart(2, "0")}`;
    return { n, id, name, email: `bench-${n}@marrowby-fenn.example`, role: n % 6 === 0 ? "lead" : "engineer" };
  });
  await bench.owner.query(`drop table if exists bench_people; drop table if exists bench_jobs`);
  await bench.owner.query(`create unlogged table bench_people (n int primary key, id text, person_text text)`);
  await bench.owner.query(`create unlogged table bench_jobs (n int primary key, id uuid, job_text text)`);
  for (const p of people) {
    await bench.owner.query(`insert into "user" (id, name, email, email_verified, role) values ($1, $2, $3, true, $4)`, [
      p.id,
      p.name,
      p.email,
      p.role,
    ]);
    await bench.owner.query(`insert into bench_people values ($1, $2, $3)`, [
      p.n,
      p.id,
      `"createdBy":${canonical({ id: p.id, name: p.name })}`,
    ]);
  }
  for (let n = 0; n < JOBS; n++) {
    const jobNumber = `BA-${String(n + 1).padStart(4, "0")}`;
    const name = `${PLACES[n % PLACES.length]} ${WORKS[Math.floor(n / PLACES.length) % WORKS.length]}`;
    const responsible = people[n % PEOPLE];
    const {
      rows: [job],
    } = await bench.owner.query(
      `insert into jobs (job_number, name, client, responsible_engineer_id, created_by_id) values ($1, $2, 'Bench client', $3, $3) returning id`,
      [jobNumber, name, responsible.id],
    );
    await bench.owner.query(`insert into bench_jobs values ($1, $2, $3)`, [
      n,
      job.id,
      `"job":${canonical({ id: job.id, name, number: jobNumber })}`,
    ]);
  }
}

/** Runs g in [lo, hi): one statement. Times spread evenly over three years, to the millisecond (as the app writes them). */
function insertRuns(bench: Bench, lo: number, hi: number, count: number) {
  return bench.owner.query(
    `insert into runs (id, job_id, version_id, outcome, pass, max_utilisation, purpose, unit_system, record, record_sha256,
                       record_bytes, created_by_id, created_at)
     select a.id, j.id, t.version_id, a.outcome, case when a.outcome = 'failed' then null else a.utilisation <= 1 end,
            case when a.outcome = 'failed' then null else a.utilisation end, 'design', 'si', b.record,
            encode(sha256(convert_to(b.record, 'UTF8')), 'hex'), octet_length(b.record), p.id, a.created_at
     from generate_series($1::int, $2::int - 1) g
     cross join lateral (
       select gen_random_uuid() as id,
              date_trunc('milliseconds', $4::timestamptz + (g * ($5::float8 / $3)) * interval '1 second'
                                                     + random() * interval '1 minute') as created_at,
              case when g % 97 = 0 then 'failed' else 'succeeded' end as outcome,
              round((0.15 + random())::numeric, 4)::float8 as utilisation,
              floor(random() * ${JOBS})::int as job, floor(random() * ${PEOPLE})::int as person, random() as template
     ) a
     join bench_templates t on a.template >= t.lo and a.template < t.hi
     join bench_jobs j on j.n = a.job
     join bench_people p on p.n = a.person
     cross join lateral (
       select t.p0 || '"createdAt":"' || to_char(a.created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') || '"'
              || t.p1 || p.person_text || t.p2 || '"id":"' || a.id || '"' || t.p3 || j.job_text || t.p4 as record
     ) b`,
    [lo, hi, count, FIRST_DAY, YEARS * 365.25 * 86_400],
  );
}

async function issueCalcs(bench: Bench): Promise<number> {
  await bench.owner.query(`drop table if exists bench_issued`);
  await bench.owner.query(
    `create unlogged table bench_issued as
       select row_number() over (order by r.created_at) as k, r.id as run_id, r.job_id, r.created_by_id as preparer,
              c.id as checker, r.created_at, gen_random_uuid() as calc_id, gen_random_uuid() as revision_id
       from runs r
       join bench_people p on p.id = r.created_by_id
       join bench_people c on c.n = (p.n + 1) % ${PEOPLE}
       where r.outcome = 'succeeded' and abs(hashtext(r.id::text)) % 40 = 0`,
  );
  await bench.owner.query(
    `insert into calcs (id, job_id, number, title, created_by_id, created_at)
       select calc_id, job_id, 'C-' || lpad(k::text, 6, '0'), 'Bench calc ' || k, preparer, created_at from bench_issued;
     insert into calc_revisions (id, calc_id, letter, run_id, preparer_id, checker_id, created_at)
       select revision_id, calc_id, 'A', run_id, preparer, checker, created_at from bench_issued;
     insert into calc_revision_events (revision_id, kind, issue_status, actor_id, occurred_at)
       select revision_id, 'prepared', 'for-approval', preparer, created_at from bench_issued;
     -- Of those issued: a tenth returned, six in ten checked, and of those checked five in six approved.
     insert into calc_revision_events (revision_id, kind, actor_id, note, occurred_at)
       select revision_id, case when k % 10 = 0 then 'returned' else 'checked' end, checker,
              case when k % 10 = 0 then 'Recheck the load case.' end, created_at + interval '1 day'
       from bench_issued where k % 10 = 0 or k % 10 >= 4;
     insert into calc_revision_events (revision_id, kind, actor_id, reason, occurred_at)
       select i.revision_id, 'approved', j.responsible_engineer_id, 'Bench approval.', i.created_at + interval '2 days'
       from bench_issued i join jobs j on j.id = i.job_id
       where i.k % 10 >= 5 and j.responsible_engineer_id <> i.preparer;`,
  );
  const {
    rows: [{ n }],
  } = await bench.owner.query(`select count(*)::int as n from bench_issued`);
  return n;
}

export async function loadBenchRuns(bench: Bench, count: number): Promise<void> {
  const started = performance.now();
  const elapsed = () => `${((performance.now() - started) / 1000).toFixed(0)} s`;
  const templates = await makeTemplates(bench);
  await makePeopleAndJobs(bench);
  say(`${templates} templates, ${PEOPLE} people, ${JOBS} jobs (${elapsed()})`);
  let next = 0;
  let done = 0;
  // Two statements at a time, each taking the next batch as it finishes.
  await Promise.all(
    [0, 1].map(async () => {
      while (next < count) {
        const lo = next;
        const hi = Math.min(count, lo + BATCH);
        next = hi;
        await insertRuns(bench, lo, hi, count);
        done += hi - lo;
        if (done % 200_000 < BATCH) say(`${done} runs (${elapsed()})`);
      }
    }),
  );
  const issued = await issueCalcs(bench);
  say(`${issued} runs issued as calc revisions (${elapsed()})`);
  await bench.owner.query(`drop table bench_templates, bench_people, bench_jobs, bench_issued`);
  for (const table of ["runs", "calcs", "calc_revisions", "calc_revision_events", "jobs"])
    await bench.owner.query(`vacuum (analyze) ${table}`);
  const {
    rows: [size],
  } = await bench.owner.query(
    `select count(*)::int as runs, pg_size_pretty(pg_total_relation_size('runs')) as total,
            round(avg(record_bytes))::int as average from runs`,
  );
  say(`loaded ${size.runs} runs, average record ${size.average} bytes, table with indexes ${size.total} (${elapsed()})`);
}
