// The whole product's schema: shops and people, the spindle (machines, materials, cutters,
// cut logs, events), the crib (suppliers, cutter types, regrind batches, purchase orders)
// and the tooling reports. Every row carries its shop; lengths in mm, money in cents, time in UTC.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table shops (
      id integer generated always as identity primary key,
      name text not null check (length(trim(name)) between 1 and 120),
      time_zone text not null default 'UTC',
      report_time time not null default '05:30',
      report_recipients text[],
      daily_all_clear boolean not null default false,
      -- Due for resharpening when life used reaches this fraction of a sharp life.
      life_threshold numeric(4,3) not null default 0.900 check (life_threshold > 0 and life_threshold <= 1.5),
      -- A reground cutter's life, as a fraction of a new cutter's rated life.
      regrind_life_fraction numeric(4,3) not null default 0.800 check (regrind_life_fraction > 0 and regrind_life_fraction <= 1),
      -- Economic order quantity inputs: cost of placing one order, yearly holding cost as a fraction of unit cost.
      order_cost_cents integer not null default 2500 check (order_cost_cents >= 0),
      holding_rate numeric(4,3) not null default 0.250 check (holding_rate > 0 and holding_rate <= 5),
      created_at timestamptz not null default now()
    );

    create table users (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      email text not null check (email = lower(email) and position('@' in email) > 1),
      name text not null check (length(trim(name)) between 1 and 120),
      role text not null check (role in ('operator', 'crib_manager', 'owner')),
      password_hash text,
      length_unit text not null default 'mm' check (length_unit in ('mm', 'in')),
      active boolean not null default true,
      created_at timestamptz not null default now(),
      last_login_at timestamptz
    );
    create unique index users_email_key on users (email);
    create index users_shop_idx on users (shop_id, role);

    -- One-time links: invitations and password resets. Only a hash of the token is kept.
    create table auth_tokens (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      user_id integer not null references users(id) on delete cascade,
      purpose text not null check (purpose in ('invite', 'reset')),
      token_hash text not null unique,
      created_by integer references users(id) on delete set null,
      created_at timestamptz not null default now(),
      expires_at timestamptz not null,
      used_at timestamptz
    );
    create index auth_tokens_user_idx on auth_tokens (user_id, purpose);

    -- Sign-in attempts, for throttling per account and per address. Written before any shop is
    -- known, so this is the one table without a shop.
    create table login_attempts (
      id bigint generated always as identity primary key,
      email text not null,
      address text not null,
      succeeded boolean not null,
      attempted_at timestamptz not null default now()
    );
    create index login_attempts_email_idx on login_attempts (email, attempted_at);
    create index login_attempts_address_idx on login_attempts (address, attempted_at);

    create table machines (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      name text not null check (length(trim(name)) between 1 and 80),
      description text not null default '',
      min_rpm integer not null check (min_rpm > 0),
      max_rpm integer not null check (max_rpm >= min_rpm and max_rpm <= 100000),
      tool_changer boolean not null default false,
      active boolean not null default true,
      created_at timestamptz not null default now(),
      unique (shop_id, name),
      unique (shop_id, id)
    );

    create table materials (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      name text not null check (length(trim(name)) between 1 and 80),
      family text not null check (family in ('hard_plastic', 'soft_plastic', 'wood', 'sheet_goods', 'non_ferrous', 'foam', 'composite')),
      -- How much faster than the reference material this one uses up life (reference = 1.0).
      wear_factor numeric(6,3) not null check (wear_factor > 0 and wear_factor <= 100),
      -- Shown with remaining minutes on the cutter page.
      common boolean not null default true,
      active boolean not null default true,
      created_at timestamptz not null default now(),
      unique (shop_id, name),
      unique (shop_id, id)
    );

    create table suppliers (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      name text not null check (length(trim(name)) between 1 and 120),
      email text check (email is null or position('@' in email) > 1),
      phone text,
      lead_time_days integer not null default 7 check (lead_time_days between 0 and 365),
      note text not null default '',
      created_at timestamptz not null default now(),
      unique (shop_id, name),
      unique (shop_id, id)
    );

    create table cutter_types (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      supplier_id integer,
      supplier_part_number text,
      name text not null check (length(trim(name)) between 1 and 120),
      profile text not null check (profile in ('square_end', 'ball_nose', 'v_bit', 'o_flute')),
      v_angle_deg numeric(5,2) check (v_angle_deg is null or (v_angle_deg > 0 and v_angle_deg < 180)),
      helix text not null check (helix in ('upcut', 'downcut', 'compression', 'straight')),
      tool_material text not null default 'solid_carbide' check (tool_material in ('solid_carbide', 'carbide_tipped', 'hss')),
      flutes integer not null check (flutes between 1 and 12),
      cutting_diameter_mm numeric(7,3) not null check (cutting_diameter_mm > 0),
      shank_diameter_mm numeric(7,3) not null check (shank_diameter_mm > 0),
      cutting_length_mm numeric(7,3) not null check (cutting_length_mm > 0),
      overall_length_mm numeric(7,3) not null check (overall_length_mm >= cutting_length_mm),
      rated_life_minutes numeric(9,2) not null check (rated_life_minutes > 0),
      max_regrinds integer not null default 2 check (max_regrinds between 0 and 20),
      regrind_diameter_loss_mm numeric(6,3) not null default 0.2 check (regrind_diameter_loss_mm >= 0),
      min_usable_diameter_mm numeric(7,3) not null check (min_usable_diameter_mm > 0 and min_usable_diameter_mm <= cutting_diameter_mm),
      unit_cost_cents integer not null check (unit_cost_cents >= 0),
      regrind_cost_cents integer not null default 0 check (regrind_cost_cents >= 0),
      pack_size integer not null default 1 check (pack_size >= 1),
      service_level numeric(5,4) not null default 0.95 check (service_level >= 0.5 and service_level < 1),
      lead_time_days_override integer check (lead_time_days_override is null or lead_time_days_override between 0 and 365),
      active boolean not null default true,
      created_at timestamptz not null default now(),
      check ((profile = 'v_bit') = (v_angle_deg is not null)),
      unique (shop_id, name),
      unique (shop_id, id),
      foreign key (shop_id, supplier_id) references suppliers (shop_id, id)
    );

    create table purchase_orders (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      supplier_id integer,
      status text not null default 'draft' check (status in ('draft', 'sent', 'partly_received', 'received', 'cancelled')),
      note text not null default '',
      created_by integer references users(id) on delete set null,
      created_at timestamptz not null default now(),
      sent_at timestamptz,
      received_at timestamptz,
      unique (shop_id, id),
      foreign key (shop_id, supplier_id) references suppliers (shop_id, id)
    );
    create index purchase_orders_shop_idx on purchase_orders (shop_id, status);

    create table purchase_order_lines (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      order_id integer not null,
      type_id integer not null,
      quantity integer not null check (quantity > 0),
      received_quantity integer not null default 0 check (received_quantity >= 0),
      unit_cost_cents integer not null check (unit_cost_cents >= 0),
      unique (shop_id, id),
      unique (order_id, type_id),
      foreign key (shop_id, order_id) references purchase_orders (shop_id, id) on delete cascade,
      foreign key (shop_id, type_id) references cutter_types (shop_id, id)
    );
    create index purchase_order_lines_type_idx on purchase_order_lines (shop_id, type_id);

    create table cutters (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      type_id integer not null,
      -- Printed on the label and in its QR code; unique across all shops because /c/<code> is global.
      code text not null unique check (code ~ '^[2-9A-HJKMNP-Z]{4,12}$'),
      status text not null default 'in_crib' check (status in ('in_crib', 'in_spindle', 'at_regrind', 'retired', 'lost')),
      machine_id integer,
      diameter_mm numeric(7,3) not null check (diameter_mm > 0),
      regrind_count integer not null default 0 check (regrind_count >= 0),
      -- This sharp life's length as a fraction of a new cutter's rated life (1 new, the shop's
      -- regrind life fraction after a regrind), fixed when the life starts.
      life_scale numeric(4,3) not null default 1 check (life_scale > 0 and life_scale <= 1),
      -- Fraction of the current sharp life used (linear damage accumulation; may pass 1).
      life_used numeric(10,6) not null default 0 check (life_used >= 0),
      minutes_this_life numeric(10,2) not null default 0 check (minutes_this_life >= 0),
      minutes_total numeric(12,2) not null default 0 check (minutes_total >= 0),
      flagged text check (flagged in ('dull', 'broken')),
      flagged_at timestamptz,
      retired_reason text check (retired_reason in ('worn', 'broken', 'undersize', 'other')),
      order_line_id integer,
      received_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      check ((status = 'in_spindle') = (machine_id is not null)),
      check ((status = 'retired') = (retired_reason is not null)),
      unique (shop_id, id),
      foreign key (shop_id, type_id) references cutter_types (shop_id, id),
      foreign key (shop_id, machine_id) references machines (shop_id, id),
      foreign key (shop_id, order_line_id) references purchase_order_lines (shop_id, id)
    );
    create index cutters_shop_status_idx on cutters (shop_id, status);
    create index cutters_shop_type_idx on cutters (shop_id, type_id, status);
    create index cutters_shop_machine_idx on cutters (shop_id, machine_id) where machine_id is not null;
    create index cutters_shop_life_idx on cutters (shop_id, life_used desc);

    create table uploads (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      storage_key text not null unique,
      kind text not null check (kind in ('photo', 'csv')),
      content_type text not null,
      size_bytes integer not null check (size_bytes > 0),
      original_name text,
      uploaded_by integer references users(id) on delete set null,
      created_at timestamptz not null default now(),
      unique (shop_id, id)
    );

    create table cut_logs (
      id bigint generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      cutter_id integer not null,
      machine_id integer,
      operator_id integer references users(id) on delete set null,
      material_id integer not null,
      minutes numeric(7,2) not null check (minutes > 0 and minutes <= 1440),
      -- The wear factor and rated minutes in force when the log was written: adopting new
      -- factors later never rewrites history.
      wear_factor numeric(6,3) not null check (wear_factor > 0),
      life_added numeric(10,6) not null check (life_added >= 0),
      regrind_count integer not null default 0 check (regrind_count >= 0),
      rpm integer check (rpm is null or (rpm > 0 and rpm <= 100000)),
      feed_mm_per_min numeric(9,2) check (feed_mm_per_min is null or feed_mm_per_min > 0),
      outcome text not null check (outcome in ('clean', 'melted', 'chip_out', 'fuzzy', 'broken')),
      note text not null default '' check (length(note) <= 2000),
      idempotency_key text not null check (length(idempotency_key) between 8 and 100),
      cut_at timestamptz not null default now(),
      created_at timestamptz not null default now(),
      unique (shop_id, idempotency_key),
      foreign key (shop_id, cutter_id) references cutters (shop_id, id),
      foreign key (shop_id, machine_id) references machines (shop_id, id),
      foreign key (shop_id, material_id) references materials (shop_id, id)
    );
    create index cut_logs_cutter_idx on cut_logs (cutter_id, cut_at desc);
    create index cut_logs_shop_day_idx on cut_logs (shop_id, cut_at);
    create index cut_logs_shop_material_idx on cut_logs (shop_id, material_id, cut_at);
    create index cut_logs_shop_machine_idx on cut_logs (shop_id, machine_id, cut_at);
    create index cut_logs_shop_operator_idx on cut_logs (shop_id, operator_id, cut_at);

    -- Every change of a cutter's state, with who and when.
    create table cutter_events (
      id bigint generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      cutter_id integer not null,
      kind text not null check (kind in ('received', 'loaded', 'returned', 'cut_logged', 'flagged_dull', 'flagged_broken',
        'sent_to_regrind', 'reground', 'retired', 'lost', 'found', 'edited')),
      from_status text check (from_status in ('in_crib', 'in_spindle', 'at_regrind', 'retired', 'lost')),
      to_status text check (to_status in ('in_crib', 'in_spindle', 'at_regrind', 'retired', 'lost')),
      machine_id integer,
      actor_id integer references users(id) on delete set null,
      photo_id integer,
      note text not null default '',
      created_at timestamptz not null default now(),
      foreign key (shop_id, cutter_id) references cutters (shop_id, id),
      foreign key (shop_id, machine_id) references machines (shop_id, id),
      foreign key (shop_id, photo_id) references uploads (shop_id, id)
    );
    create index cutter_events_cutter_idx on cutter_events (cutter_id, created_at desc);
    create index cutter_events_shop_day_idx on cutter_events (shop_id, created_at);

    create table regrind_batches (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      supplier_id integer,
      status text not null default 'draft' check (status in ('draft', 'sent', 'received', 'cancelled')),
      note text not null default '',
      created_by integer references users(id) on delete set null,
      created_at timestamptz not null default now(),
      sent_at timestamptz,
      received_at timestamptz,
      unique (shop_id, id),
      foreign key (shop_id, supplier_id) references suppliers (shop_id, id)
    );
    create index regrind_batches_shop_idx on regrind_batches (shop_id, status);

    create table regrind_batch_items (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      batch_id integer not null,
      cutter_id integer not null,
      diameter_before_mm numeric(7,3) not null check (diameter_before_mm > 0),
      diameter_after_mm numeric(7,3) check (diameter_after_mm is null or diameter_after_mm > 0),
      result text check (result in ('reground', 'retired')),
      cost_cents integer not null default 0 check (cost_cents >= 0),
      unique (batch_id, cutter_id),
      foreign key (shop_id, batch_id) references regrind_batches (shop_id, id) on delete cascade,
      foreign key (shop_id, cutter_id) references cutters (shop_id, id)
    );
    create index regrind_batch_items_cutter_idx on regrind_batch_items (shop_id, cutter_id);

    -- The morning tooling report: one row per shop and day, claimed before sending.
    create table tooling_reports (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      report_date date not null,
      status text not null check (status in ('sending', 'sent', 'failed', 'nothing_to_report')),
      recipients text[] not null default '{}',
      subject text not null default '',
      body_text text not null default '',
      body_html text not null default '',
      attempts integer not null default 0 check (attempts >= 0),
      error text,
      manual boolean not null default false,
      created_at timestamptz not null default now(),
      sent_at timestamptz
    );
    -- At most one nightly report per shop and day; manual runs come on top.
    create unique index tooling_reports_day_key on tooling_reports (shop_id, report_date) where not manual;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop table if exists tooling_reports, regrind_batch_items, regrind_batches, cutter_events, cut_logs,
      uploads, cutters, purchase_order_lines, purchase_orders, cutter_types, suppliers, materials, machines,
      login_attempts, auth_tokens, users, shops cascade
  `.execute(db)
}
