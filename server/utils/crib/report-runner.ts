// Sends the morning tooling report exactly once per shop and local day. Each shop's run is one
// transaction: a transaction-level advisory lock keeps a second app instance (or a second run)
// out, the per-day row is claimed and written in that same transaction, and the e-mail goes out
// before it commits. A crash before the commit rolls the claim back, so the next run sends the
// report instead of skipping it; the fixed Message-ID lets mail systems drop the rare copy that
// a crash between the SMTP answer and the commit could cause.
import { sql } from 'kysely'
import { reportDueDay, localClock } from '#shared/kerf/report-schedule'
import type { Tx } from '../../db/connect'

const REPORT_LOCK = 0x4B_45_52_46 // "KERF"
const SEND_TRIES = 3
/** Nightly runs give up on a day after this many failed sends (each with SEND_TRIES tries). */
export const MAX_ATTEMPTS = 5

export type ReportStatus = 'sent' | 'failed' | 'nothing_to_report' | 'already_done' | 'busy'
export interface ReportOutcome { shopId: number, status: ReportStatus, reportId?: number, reportDate?: string, recipients?: string[], subject?: string, error?: string }

async function recipientsOf(tx: Tx, shopId: number, configured: string[] | null): Promise<string[]> {
  if (configured?.length) return configured
  const people = await tx.selectFrom('users').select('email')
    .where('shop_id', '=', shopId).where('active', '=', true).where('role', 'in', ['crib_manager', 'owner'])
    .where('password_hash', 'is not', null).where('email', 'is not', null)
    .orderBy('email').execute()
  return people.flatMap((p) => (p.email ? [p.email] : []))
}

async function sendWithRetry(shopId: number, mail: OutgoingMail, delays = [500, 1500]): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await sendShopMail(shopId, 'report', mail)
      return
    } catch (err) {
      // The shop's mail rules refused it (not confirmed, over the hour's limit): no use retrying now.
      if (attempt >= SEND_TRIES || isError(err)) throw isError(err) ? new Error(err.statusMessage) : err
      await new Promise((r) => setTimeout(r, delays[attempt - 1] ?? 1000))
    }
  }
}

export async function runShopReport(shopId: number, opts: { now: Date, localDate: string, manual: boolean, baseUrl: string }): Promise<ReportOutcome> {
  return transaction(async (tx) => {
    const lock = await sql<{ locked: boolean }>`select pg_try_advisory_xact_lock(${REPORT_LOCK}, ${shopId}) as locked`.execute(tx)
    if (!lock.rows[0]?.locked) return { shopId, status: 'busy' }

    const existing = opts.manual
      ? undefined
      : await tx.selectFrom('tooling_reports').select(['id', 'status', 'attempts'])
        .where('shop_id', '=', shopId).where('report_date', '=', opts.localDate).where('manual', '=', false)
        .executeTakeFirst()
    if (existing && (existing.status !== 'failed' || existing.attempts >= MAX_ATTEMPTS)) {
      return { shopId, status: 'already_done', reportId: existing.id, reportDate: opts.localDate }
    }

    const shop = await tx.selectFrom('shops').select(['daily_all_clear', 'report_recipients']).where('id', '=', shopId).executeTakeFirstOrThrow()
    const recipients = await recipientsOf(tx, shopId, shop.report_recipients)
    const report = await buildToolingReport(tx, shopId, { baseUrl: opts.baseUrl, now: opts.now, localDate: opts.localDate })
    const quiet = report.isEmpty && !shop.daily_all_clear && !opts.manual
    const content = {
      recipients, subject: report.mail.subject, body_text: report.mail.text, body_html: report.mail.html,
      status: quiet ? 'nothing_to_report' as const : 'sending' as const,
    }
    const row = existing
      ? await tx.updateTable('tooling_reports').set({ ...content, attempts: sql`attempts + 1`, error: null })
        .where('id', '=', existing.id).returning('id').executeTakeFirstOrThrow()
      : await tx.insertInto('tooling_reports')
        .values({ shop_id: shopId, report_date: opts.localDate, manual: opts.manual, attempts: quiet ? 0 : 1, ...content })
        .returning('id').executeTakeFirstOrThrow()
    const outcome = { shopId, reportId: row.id, reportDate: opts.localDate, recipients, subject: report.mail.subject }
    if (quiet) return { ...outcome, status: 'nothing_to_report' }

    try {
      if (!recipients.length) throw new Error('No recipients: add an e-mail address in the shop settings.')
      await sendWithRetry(shopId, {
        to: recipients, ...report.mail,
        messageId: `<tooling-report-${shopId}-${opts.localDate}${opts.manual ? `-${row.id}` : ''}@kerfbook>`,
      })
      await tx.updateTable('tooling_reports').set({ status: 'sent', sent_at: new Date() }).where('id', '=', row.id).execute()
      return { ...outcome, status: 'sent' }
    } catch (err) {
      const error = err instanceof Error ? err.message : String(err)
      await tx.updateTable('tooling_reports').set({ status: 'failed', error }).where('id', '=', row.id).execute()
      return { ...outcome, status: 'failed', error }
    }
  })
}

/** Every shop whose report time has come today in its own zone. Safe to run as often as you like. */
export async function runDueReports(now = new Date()): Promise<ReportOutcome[]> {
  const shops = await useDb().selectFrom('shops').select(['id', 'time_zone', 'report_time']).orderBy('id').execute()
  const outcomes: ReportOutcome[] = []
  for (const shop of shops) {
    const day = reportDueDay(now, shop.time_zone, shop.report_time)
    if (day) outcomes.push(await runShopReport(shop.id, { now, localDate: day, manual: false, baseUrl: publicBaseUrl() }))
  }
  return outcomes
}

/** The shop's own local day, for a report run by hand. */
export async function localDateOf(shopId: number, now = new Date()): Promise<string> {
  const shop = await useDb().selectFrom('shops').select('time_zone').where('id', '=', shopId).executeTakeFirstOrThrow()
  return localClock(now, shop.time_zone).date
}
