import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { eq, sql } from 'drizzle-orm'
import { SignJWT } from 'jose'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import {
  BriefDeliveryList,
  BriefSettingsView,
  CaughtMailList,
  type BriefSettings,
} from '../../shared/schemas/brief'
import { addDays, DAY_MS, localDate } from '../../shared/time'
import {
  briefSends,
  briefSettings,
  lakes,
  subscriptions,
  users,
  userSettings,
} from '../../server/db/schema/index'
import { signLinkToken, tokenKey } from '../../server/features/auth/auth.tokens'
import { sendBriefs } from '../../server/features/brief/send-briefs'
import type { OutboxPolicy } from '../../server/lib/backoff'
import { runSendBriefs } from '../../jobs/send-briefs'
import { signedInAgent, TEST_SECRET, testApp } from '../helpers/app'
import { startWorld, type World } from '../helpers/world'
import type { TestFeed } from '../helpers/feed'
import { linkToken, startTestMail, type TestMail } from '../helpers/mail'

let ctx: World
let feed: TestFeed
let mail: TestMail
const log = pino({ level: 'silent' })
const linkKey = tokenKey(TEST_SECRET)
/** Retries a minute apart, so a test can step past them. */
const FAST: Partial<OutboxPolicy> = { baseDelayMs: 60_000, maxDelayMs: 60_000, maxAttempts: 3 }

const SETTINGS: BriefSettings = {
  enabled: true,
  sendTime: '05:00',
  days: [1, 2, 3, 4, 5, 6, 7],
  timeZone: 'America/Chicago',
}

const app = () => testApp(ctx.db, { mail: mail.mail, mailbox: mail.smtp })
const run = (now: Date, policy: Partial<OutboxPolicy> = FAST) =>
  sendBriefs({ db: ctx.db, log, mail: mail.mail, linkKey, now: () => now, policy })

/** A subscriber straight in the database: verified, following `lakeSlugs`, with these settings. */
async function subscriber(
  email: string,
  over: Partial<BriefSettings> = {},
  lakeSlugs = ['quillmere'],
) {
  const [user] = await ctx.db
    .insert(users)
    .values({ email, passwordHash: 'x', emailVerifiedAt: new Date() })
    .returning()
  const s = { ...SETTINGS, ...over }
  await ctx.db.insert(briefSettings).values({
    userId: user!.id,
    enabled: s.enabled,
    sendTime: s.sendTime,
    days: s.days,
    timeZone: s.timeZone,
  })
  for (const slug of lakeSlugs) {
    const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, slug))
    await ctx.db.insert(subscriptions).values({ userId: user!.id, lakeId: lake!.id })
  }
  return user!
}

const inbox = (to: string) => mail.smtp.messages().filter((m) => m.to.includes(to))

/** An instant that is `hh:mm` local time on `date` in Chicago (CST/CDT worked out by Intl). */
function chicago(date: string, hhmm: string): Date {
  for (const offset of ['-06:00', '-05:00']) {
    const at = new Date(`${date}T${hhmm}:00${offset}`)
    const local = new Intl.DateTimeFormat('en-GB', {
      timeZone: 'America/Chicago',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    }).format(at)
    if (local === hhmm) return at
  }
  throw new Error(`${date} ${hhmm} does not exist in Chicago`)
}

beforeAll(async () => {
  ctx = await startWorld(20)
  feed = ctx.feed
  mail = await startTestMail()
  // The demo angler's own brief would join every run below.
  await ctx.db.delete(briefSettings)
})
afterEach(async () => {
  mail.smtp.clear()
  mail.smtp.controls.refuse.clear()
  mail.smtp.controls.failNext = 0
  mail.smtp.controls.stallMs = 0
  await ctx.db.delete(briefSends)
  await ctx.db.delete(briefSettings)
})
afterAll(async () => {
  await mail.close()
  await ctx.close()
})

describe('brief settings', () => {
  it('start empty, save per field, and list the followed lakes', async () => {
    const me = await signedInAgent(app(), ctx.db, 'settings@example.test')
    const first = BriefSettingsView.parse((await me.get('/api/me/brief').expect(200)).body)
    expect(first).toEqual({
      settings: null,
      email: 'settings@example.test',
      emailVerified: false,
      lakes: [],
    })
    await me.put('/api/lakes/quillmere/subscription').expect(204)
    const saved = await me
      .put('/api/me/brief')
      .send({ ...SETTINGS, sendTime: '06:15', days: [6, 7] })
      .expect(200)
    expect(BriefSettingsView.parse(saved.body)).toMatchObject({
      settings: { sendTime: '06:15', days: [6, 7], timeZone: 'America/Chicago' },
      lakes: [{ slug: 'quillmere' }],
    })
  })

  it('puts only the chosen followed lakes in the brief, and refuses a lake not followed', async () => {
    const me = await signedInAgent(app(), ctx.db, 'chooser@example.test')
    await me.put('/api/lakes/quillmere/subscription').expect(204)
    await me.put('/api/lakes/vessandra/subscription').expect(204)
    const before = BriefSettingsView.parse((await me.get('/api/me/brief').expect(200)).body)
    // A newly followed lake goes in the brief.
    expect(before.lakes.map((l) => [l.slug, l.inBrief])).toEqual([
      ['vessandra', true],
      ['quillmere', true],
    ])
    const saved = BriefSettingsView.parse(
      (
        await me
          .put('/api/me/brief')
          .send({ ...SETTINGS, lakes: ['vessandra'] })
          .expect(200)
      ).body,
    )
    expect(saved.settings!.lakes).toEqual(['vessandra'])
    expect(saved.lakes.map((l) => [l.slug, l.inBrief])).toEqual([
      ['vessandra', true],
      ['quillmere', false],
    ])
    // Saved without a choice, the choice stands.
    await me
      .put('/api/me/brief')
      .send({ ...SETTINGS, sendTime: '06:00' })
      .expect(200)
    expect((await me.get('/api/me/brief').expect(200)).body.settings.lakes).toEqual(['vessandra'])
    const bad = await me
      .put('/api/me/brief')
      .send({ ...SETTINGS, lakes: ['vessandra', 'no-such-lake'] })
      .expect(400)
    expect(bad.body.error.fields).toEqual({ lakes: 'Choose from the lakes you follow.' })
    expect((await me.get('/api/me/brief').expect(200)).body.settings.lakes).toEqual(['vessandra'])
  })

  it('answers bad values with a message per field and saves nothing', async () => {
    const me = await signedInAgent(app(), ctx.db, 'typos@example.test')
    const bad = await me
      .put('/api/me/brief')
      .send({ ...SETTINGS, sendTime: '25:00', days: [], timeZone: 'Mars/Olympus_Mons' })
      .expect(400)
    expect(bad.body.error.fields).toEqual({
      sendTime: 'Give a time as HH:MM on a 24-hour clock.',
      days: 'Choose at least one day.',
      timeZone: 'Not a time zone we know.',
    })
    expect((await me.get('/api/me/brief').expect(200)).body.settings).toBeNull()
    await request(app()).get('/api/me/brief').expect(401)
    await request(app()).put('/api/me/brief').send(SETTINGS).expect(401)
  })
})

describe('address verification', () => {
  it('mails a signed link that confirms the address without signing in', async () => {
    const me = await signedInAgent(app(), ctx.db, 'verify@example.test')
    await me.post('/api/me/brief/verification').expect(202)
    const [message] = inbox('verify@example.test')
    expect(message!.subject).toMatch(/confirm your address/i)
    // Handlebars escapes "=" in attributes as &#x3D;, which a mail client reads back as "=".
    expect(message!.html).toContain('href="http://app.test/verify-email?token&#x3D;')
    const token = linkToken(message!.text, 'http://app.test/verify-email')

    await request(app())
      .post('/api/brief/verify')
      .send({ token: `${token}x` })
      .expect(400)
    const ok = await request(app()).post('/api/brief/verify').send({ token }).expect(200)
    expect(ok.body).toEqual({ email: 'verify@example.test' })
    expect((await me.get('/api/me/brief').expect(200)).body.emailVerified).toBe(true)
    const again = await me.post('/api/me/brief/verification').expect(409)
    expect(again.body.error.code).toBe('already_verified')
  })

  it('refuses expired links, links made for another purpose, and links for an old address', async () => {
    const me = await signedInAgent(app(), ctx.db, 'stale@example.test')
    const [user] = await ctx.db.select().from(users).where(eq(users.email, 'stale@example.test'))
    const expired = await signLinkToken(linkKey, {
      purpose: 'verify-email',
      subject: user!.id,
      claims: { email: user!.email },
      expiresAt: new Date(Date.now() - 1000),
    })
    const unsubscribe = await signLinkToken(linkKey, {
      purpose: 'brief-unsubscribe',
      subject: user!.id,
      claims: { email: user!.email },
      expiresAt: new Date(Date.now() + DAY_MS),
    })
    const oldAddress = await signLinkToken(linkKey, {
      purpose: 'verify-email',
      subject: user!.id,
      claims: { email: 'previous@example.test' },
      expiresAt: new Date(Date.now() + DAY_MS),
    })
    for (const token of [expired, unsubscribe, oldAddress]) {
      const res = await request(app()).post('/api/brief/verify').send({ token }).expect(400)
      expect(res.body.error.code).toBe('invalid_link')
    }
    const empty = await request(app()).post('/api/brief/verify').send({}).expect(400)
    expect(empty.body.error.fields.token).toBeDefined()
    expect((await me.get('/api/me/brief').expect(200)).body.emailVerified).toBe(false)
  })

  it('says so when the mail server cannot be reached', async () => {
    const me = await signedInAgent(testApp(ctx.db), ctx.db, 'nomail@example.test')
    const res = await me.post('/api/me/brief/verification').expect(503)
    expect(res.body.error.code).toBe('mail_unavailable')
  })
})

describe('the send job', () => {
  it('sends each due subscriber one brief with both parts, the day plan link and unsubscribe headers', async () => {
    const user = await subscriber('due@example.test')
    const today = localDate(feed.now(), 'America/Chicago')
    const after = chicago(today, '05:10')
    const result = await run(after)
    expect(result).toMatchObject({ claimed: 1, sent: 1, failed: 0 })
    const [message] = inbox('due@example.test')
    expect(message!.subject).toMatch(/^Morning brief, .+: Quillmere/)
    expect(message!.text).toContain(`http://app.test/lakes/quillmere/plan/${today}`)
    expect(message!.html).toContain(`http://app.test/lakes/quillmere/plan/${today}`)
    expect(message!.text).toMatch(/Follow local authorities/)
    expect(message!.headers['list-unsubscribe']).toMatch(
      /^<http:\/\/app\.test\/api\/brief\/unsubscribe\?token=[\w.-]+>$/,
    )
    expect(message!.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click')
    expect(message!.headers['message-id']).toBe(`<brief.${today}.${user.id}@chopline.invalid>`)
    // Later runs the same day send nothing more.
    await run(new Date(after.getTime() + 3_600_000))
    expect(inbox('due@example.test')).toHaveLength(1)
  })

  it('covers only the lakes chosen for the brief, in the account’s units', async () => {
    const user = await subscriber('metric@example.test', {}, ['quillmere', 'vessandra'])
    await ctx.db
      .insert(userSettings)
      .values({ userId: user.id, temperature: 'C', length: 'm', speed: 'kmh', clock: '24h' })
    const [vessandra] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'vessandra'))
    await ctx.db
      .update(subscriptions)
      .set({ inBrief: false })
      .where(eq(subscriptions.lakeId, vessandra!.id))
    const today = localDate(feed.now(), 'America/Chicago')
    expect(await run(chicago(today, '05:10'))).toMatchObject({ sent: 1 })
    const [message] = inbox('metric@example.test')
    expect(message!.subject).toMatch(/: Quillmere Reservoir$/)
    expect(message!.text).toContain('== Quillmere Reservoir ==')
    expect(message!.text).not.toContain('Vessandra')
    expect(message!.text).toMatch(/^Water \d+\.\d °C/m)
    expect(message!.text).toMatch(/wind \d+ km\/h from/)
    expect(message!.text).not.toMatch(/°F|mph|\d ft\b|\b[AP]M\b/)
  })

  it('sends nothing to unverified, switched-off, not-today or not-yet subscribers', async () => {
    const today = localDate(feed.now(), 'America/Chicago')
    const at = chicago(today, '07:00')
    const isoDow = ((new Date(`${today}T12:00:00Z`).getUTCDay() + 6) % 7) + 1
    const unverified = await subscriber('unverified@example.test')
    await ctx.db.update(users).set({ emailVerifiedAt: null }).where(eq(users.id, unverified.id))
    await subscriber('off@example.test', { enabled: false })
    await subscriber('notoday@example.test', { days: [(isoDow % 7) + 1] })
    await subscriber('later@example.test', { sendTime: '08:00' })
    await subscriber('nolakes@example.test', {}, [])
    const none = await subscriber('noneinbrief@example.test')
    await ctx.db
      .update(subscriptions)
      .set({ inBrief: false })
      .where(eq(subscriptions.userId, none.id))
    expect(await run(at)).toMatchObject({ claimed: 0, sent: 0 })
    expect(mail.smtp.messages()).toHaveLength(0)
    expect(await run(chicago(today, '08:00'))).toMatchObject({ sent: 1 })
    expect(mail.smtp.messages().map((m) => m.to)).toEqual([['later@example.test']])
  })

  it('sends once when two runners start together, with or without the job lock', async () => {
    for (let i = 0; i < 12; i++) await subscriber(`pair${i}@example.test`)
    const at = chicago(localDate(feed.now(), 'America/Chicago'), '06:00')
    const ctxFor = { db: ctx.db, log, mail: mail.mail, sessionSecret: TEST_SECRET, now: () => at }
    const [a, b] = await Promise.all([
      run(at, { ...FAST, batchSize: 5 }),
      run(at, { ...FAST, batchSize: 5 }),
    ])
    expect(a.sent + b.sent).toBe(12)
    await ctx.db.delete(briefSends)
    mail.smtp.clear()
    const locked = await Promise.all([runSendBriefs(ctxFor), runSendBriefs(ctxFor)])
    expect(locked.filter((r) => r.skipped)).toHaveLength(1)
    for (let i = 0; i < 12; i++) expect(inbox(`pair${i}@example.test`)).toHaveLength(1)
  })

  it('retries a refused delivery with backoff, then records the failure for admins', async () => {
    await subscriber('busy@example.test')
    await subscriber('gone@example.test')
    mail.smtp.controls.refuse.set('busy@example.test', 'temporary')
    mail.smtp.controls.refuse.set('gone@example.test', 'permanent')
    const at = chicago(localDate(feed.now(), 'America/Chicago'), '05:05')
    expect(await run(at)).toMatchObject({ sent: 0, retrying: 1, failed: 1 })
    // Not before the backoff has passed.
    expect(await run(new Date(at.getTime() + 1000))).toMatchObject({ claimed: 0 })
    const admin = await signedInAgent(app(), ctx.db, 'deliveries-admin@example.test', 'admin')
    const failed = BriefDeliveryList.parse(
      (await admin.get('/api/admin/brief-deliveries?status=failed').expect(200)).body,
    )
    expect(failed.items).toMatchObject([
      { email: 'gone@example.test', status: 'failed', attempts: 1 },
    ])
    expect(failed.items[0]!.lastError).toMatch(/550/)

    // Still refused on the second try; the third (the last) is refused too and recorded.
    expect(await run(new Date(at.getTime() + 2 * 60_000))).toMatchObject({ retrying: 1 })
    expect(await run(new Date(at.getTime() + 4 * 60_000))).toMatchObject({ failed: 1 })
    const all = BriefDeliveryList.parse(
      (await admin.get('/api/admin/brief-deliveries').expect(200)).body,
    )
    expect(all.items.map((d) => [d.email, d.status, d.attempts]).sort()).toEqual([
      ['busy@example.test', 'failed', 3],
      ['gone@example.test', 'failed', 1],
    ])
    const angler = await signedInAgent(app(), ctx.db, 'nosy@example.test')
    await angler.get('/api/admin/brief-deliveries').expect(403)
  })

  it('delivers on a later try once the server takes mail again', async () => {
    await subscriber('flaky@example.test')
    mail.smtp.controls.failNext = 1
    const at = chicago(localDate(feed.now(), 'America/Chicago'), '05:05')
    expect(await run(at)).toMatchObject({ retrying: 1 })
    expect(await run(new Date(at.getTime() + 2 * 60_000))).toMatchObject({ sent: 1 })
    expect(inbox('flaky@example.test')).toHaveLength(1)
  })

  it('gives up a brief still waiting to retry once its local day has passed, and says why', async () => {
    await subscriber('late@example.test')
    await subscriber('punctual@example.test')
    mail.smtp.controls.refuse.set('late@example.test', 'temporary')
    const today = localDate(feed.now(), 'America/Chicago')
    expect(await run(chicago(today, '05:05'))).toMatchObject({ sent: 1, retrying: 1 })
    // Past midnight in Chicago, before the next 05:00: yesterday's retry is over, and the sent one stays sent.
    expect(await run(chicago(addDays(today, 1), '00:30'))).toMatchObject({ claimed: 0 })
    const rows = await ctx.db
      .select({ email: users.email, status: briefSends.status, lastError: briefSends.lastError })
      .from(briefSends)
      .innerJoin(users, eq(users.id, briefSends.userId))
    expect(rows.find((r) => r.email === 'punctual@example.test')).toMatchObject({ status: 'sent' })
    const late = rows.find((r) => r.email === 'late@example.test')!
    expect(late.status).toBe('failed')
    expect(late.lastError).toMatch(/The day passed before it could be sent\.$/)
    expect(inbox('late@example.test')).toHaveLength(0)
  })
})

describe('one-click unsubscribe', () => {
  it('works from the header without signing in, and stops the next brief', async () => {
    await subscriber('leaving@example.test')
    const today = localDate(feed.now(), 'America/Chicago')
    await run(chicago(today, '05:01'))
    const [message] = inbox('leaving@example.test')
    const header = message!.headers['list-unsubscribe']!.slice(1, -1)
    const token = new URL(header).searchParams.get('token')!
    expect(linkToken(message!.text, 'http://app.test/unsubscribe')).toBe(token)

    await request(app())
      .get(`/api/brief/unsubscribe?token=${token}`)
      .expect(303)
      .expect('location', `/unsubscribe?token=${token}`)
    await request(app())
      .post(`/api/brief/unsubscribe?token=${token}`)
      .type('form')
      .send('List-Unsubscribe=One-Click')
      .expect(200)
    const [row] = await ctx.db
      .select()
      .from(briefSettings)
      .innerJoin(users, eq(users.id, briefSettings.userId))
      .where(eq(users.email, 'leaving@example.test'))
    expect(row!.brief_settings.enabled).toBe(false)
    const tomorrow = new Date(chicago(today, '05:01').getTime() + DAY_MS)
    await run(tomorrow)
    expect(inbox('leaving@example.test')).toHaveLength(1)
  })

  it('cannot be forged: a token signed with another key or edited is refused', async () => {
    const victim = await subscriber('victim@example.test')
    const forged = await new SignJWT({})
      .setProtectedHeader({ alg: 'HS256' })
      .setAudience('brief-unsubscribe')
      .setSubject(victim.id)
      .setExpirationTime('1d')
      .sign(tokenKey('a-different-secret-that-is-long-enough-too'))
    const unsigned = `${Buffer.from('{"alg":"none"}').toString('base64url')}.${Buffer.from(
      JSON.stringify({ aud: 'brief-unsubscribe', sub: victim.id }),
    ).toString('base64url')}.`
    for (const token of [forged, unsigned, 'not-a-token-at-all-xxxx']) {
      const res = await request(app()).post(`/api/brief/unsubscribe?token=${token}`).expect(400)
      expect(res.body.error.code).toBe('invalid_link')
    }
    const [row] = await ctx.db
      .select()
      .from(briefSettings)
      .where(eq(briefSettings.userId, victim.id))
    expect(row!.enabled).toBe(true)
  })
})

describe('daylight saving', () => {
  /** Runs the job every 10 minutes from `from` for `hours`, as the schedule would. */
  async function sweep(from: Date, hours: number) {
    for (let t = from.getTime(); t < from.getTime() + hours * 3_600_000; t += 10 * 60_000)
      await run(new Date(t))
  }
  const sentDates = async (email: string) =>
    (
      await ctx.db.execute<{ local_date: string }>(sql`
        select s.local_date::text from brief_sends s join users u on u.id = s.user_id
        where u.email = ${email} and s.status = 'sent' order by s.local_date`)
    ).rows.map((r) => r.local_date)

  it('spring forward (America/Chicago, 2027-03-14): a send time inside the skipped hour still sends, once a day', async () => {
    await subscriber('gap@example.test', { sendTime: '02:30' })
    await subscriber('dawn@example.test', { sendTime: '05:00' })
    await sweep(chicago('2027-03-13', '00:05'), 72)
    expect(await sentDates('gap@example.test')).toEqual(['2027-03-13', '2027-03-14', '2027-03-15'])
    expect(await sentDates('dawn@example.test')).toEqual(['2027-03-13', '2027-03-14', '2027-03-15'])
    expect(inbox('gap@example.test')).toHaveLength(3)
    // On the day itself 02:30 never happens; the brief goes at 03:00 CDT, the first run after.
    const [gapRow] = (
      await ctx.db.execute<{ sent_at: string }>(sql`
        select s.sent_at from brief_sends s join users u on u.id = s.user_id
        where u.email = 'gap@example.test' and s.local_date = '2027-03-14'`)
    ).rows
    expect(Date.parse(gapRow!.sent_at)).toBeGreaterThanOrEqual(
      chicago('2027-03-14', '03:00').getTime(),
    )
  })

  it('fall back (America/Chicago, 2026-11-01): a send time inside the repeated hour sends once, not twice', async () => {
    await subscriber('twice@example.test', { sendTime: '01:30' })
    await subscriber('early@example.test', { sendTime: '05:00' })
    await sweep(new Date('2026-10-31T05:05:00Z'), 72)
    expect(await sentDates('twice@example.test')).toEqual([
      '2026-10-31',
      '2026-11-01',
      '2026-11-02',
    ])
    expect(await sentDates('early@example.test')).toEqual([
      '2026-10-31',
      '2026-11-01',
      '2026-11-02',
    ])
    expect(inbox('twice@example.test')).toHaveLength(3)
  })
})

describe('the development inbox', () => {
  it('lists caught mail for admins only, and does not exist where real mail is sent', async () => {
    const me = await signedInAgent(app(), ctx.db, 'inbox-angler@example.test')
    await me.post('/api/me/brief/verification').expect(202)
    const admin = await signedInAgent(app(), ctx.db, 'inbox-admin@example.test', 'admin')
    const list = CaughtMailList.parse((await admin.get('/api/admin/mailbox').expect(200)).body)
    expect(list.items[0]).toMatchObject({ to: ['inbox-angler@example.test'] })
    const one = await admin.get(`/api/admin/mailbox/${list.items[0]!.id}`).expect(200)
    expect(one.body.text).toContain('/verify-email?token=')
    await admin.get('/api/admin/mailbox/99999').expect(404)
    await me.get('/api/admin/mailbox').expect(403)
    const production = await signedInAgent(
      testApp(ctx.db),
      ctx.db,
      'prod-admin@example.test',
      'admin',
    )
    expect((await production.get('/api/admin/mailbox').expect(404)).body.error.code).toBe(
      'no_mailbox',
    )
  })
})

describe('a send process killed between claim and send', () => {
  it(
    'leaves the claimed brief to the next run after its lease, which sends it once',
    { timeout: 60_000 },
    async () => {
      // Due around the clock, so the real process finds it due at the real time.
      await subscriber('killed@example.test', { sendTime: '00:00', timeZone: 'UTC' })
      mail.smtp.controls.stallMs = 60_000
      const child = spawn(process.execPath, ['--import', 'tsx', 'jobs/send-briefs.ts'], {
        cwd: fileURLToPath(new URL('../..', import.meta.url)),
        env: {
          ...process.env,
          DATABASE_URL: ctx.url,
          SMTP_URL: mail.smtp.url,
          SESSION_SECRET: TEST_SECRET,
          APP_ORIGIN: 'http://app.test',
          LOG_LEVEL: 'silent',
        },
        stdio: 'ignore',
      })
      const exited = new Promise<NodeJS.Signals | null>((resolve) =>
        child.once('exit', (_code, signal) => resolve(signal)),
      )
      const claimed = async () => (await ctx.db.select().from(briefSends)).length
      const deadline = Date.now() + 30_000
      while ((await claimed()) === 0 && Date.now() < deadline)
        await new Promise((r) => setTimeout(r, 50))
      // Claimed, and its message is at the SMTP server waiting for the 250 it never gets.
      await new Promise((r) => setTimeout(r, 300))
      child.kill('SIGKILL')
      expect(await exited).toBe('SIGKILL')
      mail.smtp.controls.stallMs = 0
      const [row] = await ctx.db.select().from(briefSends)
      expect(row).toMatchObject({ status: 'sending', attempts: 1 })
      expect(inbox('killed@example.test')).toHaveLength(0)

      // Inside the lease nothing is taken over; after it, the brief goes once.
      expect(await run(new Date())).toMatchObject({ claimed: 0 })
      const afterLease = new Date(row!.leaseUntil!.getTime() + 60_000)
      expect(await run(afterLease)).toMatchObject({ claimed: 1, sent: 1 })
      await run(new Date(afterLease.getTime() + 3_600_000))
      expect(inbox('killed@example.test')).toHaveLength(1)
    },
  )
})
