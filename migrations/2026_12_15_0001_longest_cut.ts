// The cut form weighs a new log against its type's longest logged cut. Reading that as max() over
// every log of the type cost a scan that grew with the shop's history, on every cutter page and
// every logged cut. The type keeps the figure now: a new log that is longer raises it (one indexed
// update, only then); a correction or a void recounts it for that type, since it may lower it.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table cutter_types add column longest_cut_minutes numeric(7,2);

    update cutter_types t set longest_cut_minutes = x.longest
      from (
        select c.shop_id, c.type_id, max(l.minutes) as longest
        from cut_logs l join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
        where l.voided_at is null
        group by 1, 2
      ) x
      where t.shop_id = x.shop_id and t.id = x.type_id;

    create function cut_logs_longest() returns trigger language plpgsql as $$
    declare
      type_id integer;
    begin
      select c.type_id into type_id from cutters c where c.id = new.cutter_id and c.shop_id = new.shop_id;
      if tg_op = 'INSERT' then
        if new.voided_at is null then
          update cutter_types set longest_cut_minutes = new.minutes
            where shop_id = new.shop_id and id = type_id
              and (longest_cut_minutes is null or longest_cut_minutes < new.minutes);
        end if;
      else
        update cutter_types set longest_cut_minutes = (
            select max(l.minutes) from cut_logs l join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
            where l.shop_id = new.shop_id and c.type_id = cutter_types.id and l.voided_at is null)
          where shop_id = new.shop_id and id = type_id;
      end if;
      return null;
    end $$;

    create trigger cut_logs_longest_insert after insert on cut_logs
      for each row execute function cut_logs_longest();
    create trigger cut_logs_longest_change after update of minutes, voided_at on cut_logs
      for each row when (old.minutes is distinct from new.minutes or old.voided_at is distinct from new.voided_at)
      execute function cut_logs_longest();
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop trigger cut_logs_longest_change on cut_logs;
    drop trigger cut_logs_longest_insert on cut_logs;
    drop function cut_logs_longest();
    alter table cutter_types drop column longest_cut_minutes;
  `.execute(db)
}
