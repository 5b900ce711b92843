// NC programs and the tool changer. A cutter loaded into a machine with pockets sits in one pocket
// (one cutter a pocket, held by a partial unique index over loaded cutters); a machine may map the
// tool numbers programs call to its pockets (otherwise T3 is pocket 3) and says how quickly it
// accelerates and rapids, for the time estimates. Programs are read once at upload and keep their
// reading; a run of a program logs one cut per tool and keeps which logs it wrote, so its tooling
// cost can be found by job reference.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table machines add column acceleration_mm_s2 integer not null default 1000 check (acceleration_mm_s2 between 10 and 100000);
    alter table machines add column rapid_mm_per_min integer not null default 10000 check (rapid_mm_per_min between 100 and 200000);

    alter table cutters add column pocket integer check (pocket between 1 and 99);
    create unique index cutters_machine_pocket_key on cutters (shop_id, machine_id, pocket)
      where status = 'in_spindle' and pocket is not null;

    create table machine_tool_pockets (
      shop_id integer not null references shops(id) on delete cascade,
      machine_id integer not null,
      tool integer not null check (tool between 0 and 9999),
      pocket integer not null check (pocket between 1 and 99),
      primary key (shop_id, machine_id, tool),
      foreign key (shop_id, machine_id) references machines (shop_id, id) on delete cascade
    );

    create table nc_programs (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      name text not null check (length(name) between 1 and 200),
      size_bytes integer not null check (size_bytes > 0),
      storage_key text not null,
      units text not null check (units in ('mm', 'inch')),
      spindle_tool integer check (spindle_tool between 0 and 9999),
      tools jsonb not null,
      -- Per machine setting ('acceleration/rapid'), the estimates of each tool, read once each.
      estimates jsonb not null default '{}',
      problems jsonb not null default '[]',
      tool_count integer not null check (tool_count >= 1),
      total_minutes numeric(10,3) not null check (total_minutes >= 0),
      line_count integer not null,
      uploaded_by integer references users(id) on delete set null,
      created_at timestamptz not null default now(),
      unique (shop_id, id)
    );
    create index nc_programs_shop_idx on nc_programs (shop_id, created_at desc);

    create table nc_runs (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      program_id integer not null,
      machine_id integer not null,
      material_id integer not null,
      repeats integer not null check (repeats between 1 and 1000),
      job_ref text not null default '' check (length(job_ref) <= 100),
      operator_id integer references users(id) on delete set null,
      idempotency_key text not null check (length(idempotency_key) between 8 and 80),
      created_at timestamptz not null default now(),
      unique (shop_id, id),
      unique (shop_id, idempotency_key),
      foreign key (shop_id, program_id) references nc_programs (shop_id, id),
      foreign key (shop_id, machine_id) references machines (shop_id, id),
      foreign key (shop_id, material_id) references materials (shop_id, id)
    );
    create index nc_runs_shop_job_idx on nc_runs (shop_id, job_ref);

    create table nc_run_logs (
      shop_id integer not null references shops(id) on delete cascade,
      run_id integer not null,
      tool integer not null,
      cut_log_id bigint not null references cut_logs(id),
      primary key (shop_id, run_id, tool),
      foreign key (shop_id, run_id) references nc_runs (shop_id, id) on delete cascade
    );
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop table nc_run_logs;
    drop table nc_runs;
    drop table nc_programs;
    drop table machine_tool_pockets;
    drop index cutters_machine_pocket_key;
    alter table cutters drop column pocket;
    alter table machines drop column rapid_mm_per_min;
    alter table machines drop column acceleration_mm_s2;
  `.execute(db)
}
