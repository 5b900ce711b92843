-- requireUser (server/utils/auth.ts): the user, re-read on every request.
select "id", "shop_id", "role", "name", "email", "length_unit", "active" from "users" where "id" = :user and "shop_id" = :shop;
begin;
-- lockCutter (server/utils/spindle.ts)
select "c"."id", "c"."code", "c"."status", "c"."machine_id", "c"."flagged", "c"."regrind_count", "c"."life_scale", "c"."life_used", "t"."rated_life_minutes" from "cutters" as "c" inner join "cutter_types" as "t" on "t"."id" = "c"."type_id" and "t"."shop_id" = "c"."shop_id" where "c"."shop_id" = :shop and "c"."id" = :cutter for update of "c" \gset c_
-- the idempotency check
select "id", "cutter_id", "machine_id", "operator_id", "material_id", "minutes", "wear_factor", "life_added", "rpm", "feed_mm_per_min", "outcome", "note", "idempotency_key", "cut_at" from "cut_logs" where "shop_id" = :shop and "idempotency_key" = 'pgbench-' || :key::text;
-- the material and its wear factor
select "id", "wear_factor" from "materials" where "shop_id" = :shop and "id" = :material and "active" = true \gset m_
\set added :minutes * :m_wear_factor / (:c_rated_life_minutes * :c_life_scale)
-- the log (its trigger keeps cut_log_daily and cut_log_lives)
insert into "cut_logs" ("shop_id", "cutter_id", "machine_id", "operator_id", "material_id", "minutes", "wear_factor", "life_added", "regrind_count", "rpm", "feed_mm_per_min", "outcome", "note", "idempotency_key", "cut_at") values (:shop, :cutter, :c_machine_id, :user, :material, :minutes, :m_wear_factor, round(:added::numeric, 6), :c_regrind_count, null, null, 'clean', '', 'pgbench-' || :key::text, now()) returning "id", "cutter_id", "machine_id", "operator_id", "material_id", "minutes", "wear_factor", "life_added", "rpm", "feed_mm_per_min", "outcome", "note", "idempotency_key", "cut_at";
-- the cutter's life and minutes
update "cutters" set "life_used" = life_used + round(:added::numeric, 6), "minutes_this_life" = minutes_this_life + :minutes, "minutes_total" = minutes_total + :minutes, "updated_at" = now() where "shop_id" = :shop and "id" = :cutter;
-- the event
insert into "cutter_events" ("shop_id", "cutter_id", "kind", "from_status", "to_status", "machine_id", "actor_id", "note", "photo_id") values (:shop, :cutter, 'cut_logged', :c_status, :c_status, :c_machine_id, :user, :minutes::text || ' min, clean', null);
commit;
-- the totals the route answers with
select "life_used", "minutes_total", "status" from "cutters" where "shop_id" = :shop and "id" = :cutter;
