import { and, eq } from 'drizzle-orm'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seed/index'
import { lakeDays, trips, users, watchAlerts, watches } from '../../server/db/schema/index'
import { tokenKey } from '../../server/features/auth/auth.tokens'
import { startPushServer, type PushServer } from '../../server/fakes/push/index'
import { generateVapid, webPushSender } from '../../server/features/watch/push'
import { pushSubscriptions } from '../../server/db/schema/index'
import { PushPayload } from '../../shared/schemas/push'
import { checkWatches } from '../../server/features/watch/send-alerts'
import { runCheckWatches } from '../../jobs/check-watches'
import type { LakeDay } from '../../shared/conditions/day-plan'
import { SentAlert, Watch, WatchList, type WatchInput } from '../../shared/schemas/watch'
import { TEST_SECRET, testApp } from '../helpers/app'
import { linkToken, startTestMail, type TestMail } from '../helpers/mail'
import { describeScenario, type ScenarioWorld } from '../helpers/scenario'

const log = pino({ level: 'silent' })
const email = (role: string) => DEMO_USERS.find((u) => u.role === role)!.email

/**
 * The blow (2026-04-14 on Quillmere): 13 m/s from 200° through midday and afternoon, 6 m/s at
 * dawn; the next day's midday hides two hours at 13 m/s in 6 m/s; the day after is light from the
 * south-west. A bank on the north-north-east shore (20° from the centre) faces the wind.
 */
describeScenario('blow', (get) => {
  let w: ScenarioWorld
  let mail: TestMail
  let pushes: PushServer
  let windward: string
  let lee: string
  const vapid = generateVapid('mailto:alerts@chopline.example')
  const app = () =>
    testApp(w.db, {
      mail: mail.mail,
      mailbox: mail.smtp,
      push: { publicKey: vapid.publicKey, pushbox: pushes },
    })
  const check = (deps: Partial<Parameters<typeof checkWatches>[0]> = {}) =>
    checkWatches({
      db: w.db,
      log,
      mail: mail.mail,
      linkKey: tokenKey(TEST_SECRET),
      now: () => w.feed.now(),
      ...deps,
    })
  const signIn = async (role: string) => {
    const agent = request.agent(app())
    await agent
      .post('/api/auth/signin')
      .send({ email: email(role), password: DEMO_PASSWORD })
      .expect(200)
    return agent
  }
  const watchBody = (over: Partial<WatchInput> = {}) => ({
    name: 'Point on the wind',
    lakeSlug: w.lake.slug,
    bankId: windward,
    conditions: { wind: { onto: true, min: 8, max: 20, unit: 'mph' } },
    channels: ['email'],
    ...over,
  })
  /** Alerts of one watch as stored: date, window, episode, whether it is still open. */
  const alertsOf = async (watchId: string) =>
    (
      await w.db
        .select()
        .from(watchAlerts)
        .where(eq(watchAlerts.watchId, watchId))
        .orderBy(watchAlerts.date, watchAlerts.windowId, watchAlerts.episode)
    ).map(
      (a) => `${a.date} ${a.windowId} #${a.episode}${a.clearedAt ? ' cleared' : ''} ${a.status}`,
    )
  const mailFor = (subject: string) =>
    mail.smtp.messages().filter((m) => m.subject.startsWith(subject))

  beforeAll(async () => {
    w = get()
    mail = await startTestMail()
    pushes = await startPushServer()
    windward = (await w.saveBank('North point', 20, ['rock'])).id
    lee = (await w.saveBank('South cove', 200, ['wood'])).id
  })
  afterAll(async () => {
    await mail.close()
    await pushes.close()
  })

  it('sets, lists, edits and deletes a watch through the API, each angler their own', async () => {
    const angler = await signIn('angler')
    const made = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(watchBody({ name: 'Scratch' }))
          .expect(201)
      ).body,
    )
    expect(made).toMatchObject({ kind: 'angler', bank: { name: 'North point' }, active: true })
    expect(made.conditions).toEqual({
      wind: { onto: true, min: 8, max: 20, unit: 'mph' },
      clarity: [],
      phases: [],
      windows: [],
      notNoGo: true,
      daysAhead: null,
    })
    const guide = await signIn('guide')
    await guide.delete(`/api/watches/${made.id}`).expect(404)
    await guide.post('/api/watches').send(watchBody()).expect(400)
    const list = WatchList.parse((await angler.get('/api/watches').expect(200)).body)
    expect(list.items.map((x) => x.name)).toContain('Scratch')
    await angler
      .patch(`/api/watches/${made.id}`)
      .send({ active: false })
      .expect(200)
      .expect((res) => expect(res.body.active).toBe(false))
    const noBank = await angler
      .post('/api/watches')
      .send(watchBody({ bankId: null }))
      .expect(400)
    expect(noBank.body.error.fields.bankId).toMatch(/needs a bank/)
    await angler.delete(`/api/watches/${made.id}`).expect(204)
  })

  it('tells a watch once per matching window: dawn while the blow builds, not the no-go hours, nor a lee bank', async () => {
    const angler = await signIn('angler')
    const onto = Watch.parse((await angler.post('/api/watches').send(watchBody()).expect(201)).body)
    const leeWatch = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(watchBody({ name: 'Cove on the wind', bankId: lee }))
          .expect(201)
      ).body,
    )
    const first = await check()
    expect(first).toMatchObject({ failed: 0, retrying: 0 })
    // Day 0 dawn 6.2 m/s (14 mph) from 200° onto the point: a match; midday and afternoon no-go.
    // Day 1: dawn 5.5 m/s and afternoon 5.3 m/s match; midday's typical 8.1 m/s (18 mph) is
    // inside the range but its worst hour makes it a no-go. Day 2 midday 4 m/s from 231°.
    const alerts = await alertsOf(onto.id)
    expect(alerts).toContain(`${w.dateOf(0)} dawn #1 sent`)
    expect(alerts).toContain(`${w.dateOf(1)} dawn #1 sent`)
    expect(alerts).toContain(`${w.dateOf(1)} afternoon #1 sent`)
    expect(alerts.some((a) => a.startsWith(`${w.dateOf(0)} midday`))).toBe(false)
    expect(alerts.some((a) => a.startsWith(`${w.dateOf(1)} midday`))).toBe(false)
    expect(await alertsOf(leeWatch.id)).toEqual([])

    const sent = mailFor('Point on the wind')
    expect(sent).toHaveLength(alerts.length)
    const dawn = sent.find((m) => m.text.includes(`/plan/${w.dateOf(0)}#window-dawn`))!
    expect(dawn.to).toEqual([email('angler')])
    expect(dawn.text).toContain('Wind 14 mph from SSW, onto it at North point')
    expect(dawn.subject).toBe('Point on the wind: dawn to mid-morning on Tue, Apr 14 matches')
    expect(dawn.headers['list-unsubscribe']).toContain('/api/watch/unsubscribe?token=')

    // A second run, and two runners at once, tell nothing again.
    const again = await Promise.all([
      check(),
      check(),
      runCheckWatches({ ...deps(), sessionSecret: TEST_SECRET }),
    ])
    expect(again.filter((r) => 'claimed' in r).every((r) => r.claimed === 0)).toBe(true)
    expect(mailFor('Point on the wind')).toHaveLength(alerts.length)

    function deps() {
      return { db: w.db, log, mail: mail.mail, now: () => w.feed.now() }
    }
  })

  it('asks for a go only when told to: without it the hidden blow of the next midday matches', async () => {
    const angler = await signIn('angler')
    const any = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(
            watchBody({
              name: 'Any verdict',
              conditions: { wind: { onto: true, min: 8, max: 20, unit: 'mph' }, notNoGo: false },
            } as Partial<WatchInput>),
          )
          .expect(201)
      ).body,
    )
    await check()
    expect(await alertsOf(any.id)).toContain(`${w.dateOf(1)} midday #1 sent`)
    await angler.delete(`/api/watches/${any.id}`).expect(204)
  })

  it('keeps to the days ahead it was given: one day ahead tells today’s dawn, not tomorrow’s', async () => {
    const angler = await signIn('angler')
    const today = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(
            watchBody({
              name: 'Today only',
              conditions: { wind: { onto: true, min: 8, max: 20, unit: 'mph' }, daysAhead: 1 },
            } as Partial<WatchInput>),
          )
          .expect(201)
      ).body,
    )
    expect(today.conditions.daysAhead).toBe(1)
    await check()
    // The same windows as the point's watch above, cut to the lake's today (day 0).
    expect(await alertsOf(today.id)).toEqual([`${w.dateOf(0)} dawn #1 sent`])
    const tooFar = await angler
      .post('/api/watches')
      .send(
        watchBody({
          conditions: { wind: null, daysAhead: 9 },
        } as Partial<WatchInput>),
      )
      .expect(400)
    expect(tooFar.body.error.fields['conditions.daysAhead']).toMatch(/At most 7/)
    await angler.delete(`/api/watches/${today.id}`).expect(204)
  })

  it('names the bank’s side of the wind on a watch that does not ask for it onto the bank', async () => {
    const angler = await signIn('angler')
    const cove = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(
            watchBody({
              name: 'Cove in any wind',
              bankId: lee,
              conditions: { wind: { onto: false, min: 8, max: 20, unit: 'mph' } },
            } as Partial<WatchInput>),
          )
          .expect(201)
      ).body,
    )
    await check()
    // Day 0's dawn: 6 m/s (14 mph) from 200°, straight off the south cove's shore (it faces 200°
    // from the centre), so the cove is in the lee; the window matches all the same.
    const [dawn] = await w.db
      .select()
      .from(watchAlerts)
      .where(and(eq(watchAlerts.watchId, cove.id), eq(watchAlerts.date, w.dateOf(0))))
    expect(dawn).toMatchObject({ windowId: 'dawn', match: { exposure: 'lee' } })
    const told = mailFor('Cove in any wind').find((m) => m.text.includes('#window-dawn'))!
    expect(told.text).toContain('in the lee at South cove')
    await angler.delete(`/api/watches/${cove.id}`).expect(204)
  })

  it('claims each window once when two runners match the same watch at the same time', async () => {
    const angler = await signIn('angler')
    const twin = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(watchBody({ name: 'Twin runners' }))
          .expect(201)
      ).body,
    )
    const [a, b] = await Promise.all([check(), check()])
    const windows = (await alertsOf(twin.id)).length
    expect(windows).toBeGreaterThan(0)
    expect(a.claimed + b.claimed).toBe(windows)
    expect(mailFor('Twin runners')).toHaveLength(windows)
    await angler.delete(`/api/watches/${twin.id}`).expect(204)
  })

  it('says nothing when a window stops matching, and tells it again when it matches again', async () => {
    const angler = await signIn('angler')
    const flip = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(
            watchBody({
              name: 'Flip',
              conditions: {
                wind: { onto: true, min: 8, max: 20, unit: 'mph' },
                windows: ['afternoon'],
              },
            } as Partial<WatchInput>),
          )
          .expect(201)
      ).body,
    )
    await check()
    const date = w.dateOf(1)
    const onDate = async () => (await alertsOf(flip.id)).filter((a) => a.startsWith(date))
    expect(await onDate()).toEqual([`${date} afternoon #1 sent`])
    const before = mailFor('Flip').length
    const stored = (await w.lakeDay(1))!
    const withWind = (windMs: number): LakeDay => ({
      ...stored,
      windows: stored.windows.map((x) =>
        x.id === 'afternoon' && x.weather ? { ...x, weather: { ...x.weather, windMs } } : x,
      ),
    })
    const setDay = (day: LakeDay) =>
      w.db
        .update(lakeDays)
        .set({ day })
        .where(and(eq(lakeDays.lakeId, w.lake.id), eq(lakeDays.date, date)))

    await setDay(withWind(1)) // a calm afternoon: no longer 8 to 20 mph
    expect((await check()).cleared).toBeGreaterThanOrEqual(1)
    expect(await onDate()).toEqual([`${date} afternoon #1 cleared sent`])
    await check()
    expect(mailFor('Flip')).toHaveLength(before)

    await setDay(stored) // the wind is back
    await check()
    expect(await onDate()).toEqual([
      `${date} afternoon #1 cleared sent`,
      `${date} afternoon #2 sent`,
    ])
    expect(mailFor('Flip')).toHaveLength(before + 1)
    await angler.delete(`/api/watches/${flip.id}`).expect(204)
  })

  it('stops a watch from the link in its mail', async () => {
    const sent = mailFor('Point on the wind')[0]!
    const token = linkToken(sent.text, 'http://app.test/watch/stop')
    await request(app()).post(`/api/watch/unsubscribe?token=${token}`).expect(200)
    await request(app()).post('/api/watch/unsubscribe?token=forged').expect(400)
    const [row] = await w.db.select().from(watches).where(eq(watches.name, 'Point on the wind'))
    expect(row!.active).toBe(false)
  })

  it('tells the guide once when the trip day turns no-go, and not for a fine day', async () => {
    const [guide] = await w.db
      .select()
      .from(users)
      .where(eq(users.email, email('guide')))
    const trip = async (date: string) =>
      (
        await w.db
          .insert(trips)
          .values({
            guideId: guide!.id,
            lakeId: w.lake.id,
            date,
            meetingPoint: 'Ramp',
            meetingTime: '06:00',
          })
          .returning()
      )[0]!
    const blowDay = await trip(w.dateOf(0))
    const fineDay = await trip(w.dateOf(2))
    await check()
    await check()
    const [tripWatch] = await w.db.select().from(watches).where(eq(watches.tripId, blowDay.id))
    expect(tripWatch).toMatchObject({ kind: 'trip', userId: guide!.id })
    expect(await alertsOf(tripWatch!.id)).toEqual([`${w.dateOf(0)} day #1 sent`])
    const [fineWatch] = await w.db.select().from(watches).where(eq(watches.tripId, fineDay.id))
    expect(await alertsOf(fineWatch!.id)).toEqual([])
    const told = mail.smtp.messages().filter((m) => m.to.includes(email('guide')))
    expect(told).toHaveLength(1)
    expect(told[0]!.subject).toMatch(/^Trip on .* at .*: no-go$/)
    expect(told[0]!.text).toContain(`/guide/trips/${blowDay.id}`)
    expect(told[0]!.text).toMatch(/Wind \d+ kt/)

    // The guide's list shows the trip's watch; it follows the trip, so only pausing edits it.
    const agent = await signIn('guide')
    const list = WatchList.parse((await agent.get('/api/watches').expect(200)).body)
    expect(list.items.find((x) => x.id === tripWatch!.id)?.lastAlert?.windowId).toBe('day')
    await agent.put(`/api/watches/${tripWatch!.id}`).send(watchBody()).expect(409)
  })

  it('pushes to each of the angler’s devices once, and drops a device the push service calls gone', async () => {
    const angler = await signIn('angler')
    expect((await angler.get('/api/push/key').expect(200)).body.publicKey).toBe(vapid.publicKey)
    const phone = pushes.subscribe()
    const tablet = pushes.subscribe()
    await angler.put('/api/me/push').send(phone).expect(204)
    await angler.put('/api/me/push').send(tablet).expect(204)
    const pushed = Watch.parse(
      (
        await angler
          .post('/api/watches')
          .send(
            watchBody({
              name: 'Pushed',
              channels: ['push'],
              conditions: { wind: { onto: true, min: 8, max: 20, unit: 'mph' }, windows: ['dawn'] },
            } as Partial<WatchInput>),
          )
          .expect(201)
      ).body,
    )
    const push = webPushSender({ db: w.db, log, vapid })
    await check({ push })
    await check({ push })
    const windows = (await alertsOf(pushed.id)).length
    expect(windows).toBeGreaterThan(0)
    const got = pushes
      .messages()
      .map((m) => ({ ...m, payload: PushPayload.parse(JSON.parse(m.payload)) }))
    const ours = got.filter((m) => m.payload.title === 'Pushed matches')
    expect(ours).toHaveLength(windows * 2)
    expect(new Set(ours.map((m) => m.endpoint))).toEqual(new Set([phone.endpoint, tablet.endpoint]))
    expect(ours.some((m) => m.payload.url.endsWith(`/plan/${w.dateOf(0)}#window-dawn`))).toBe(true)
    expect(ours[0]!.ttl).toBeGreaterThan(0)
    expect(mailFor('Pushed')).toHaveLength(0)

    // The tablet's subscription expires: the next alert reaches the phone and drops the tablet.
    pushes.expire(tablet.endpoint)
    await w.db.update(watches).set({ episodes: {} }).where(eq(watches.id, pushed.id))
    await w.db.delete(watchAlerts).where(eq(watchAlerts.watchId, pushed.id))
    await check({ push })
    const endpoints = (await w.db.select().from(pushSubscriptions)).map((s) => s.endpoint)
    expect(endpoints).toContain(phone.endpoint)
    expect(endpoints).not.toContain(tablet.endpoint)
    expect(await alertsOf(pushed.id)).toEqual(
      (await alertsOf(pushed.id)).map((a) => a.replace(/ \w+$/, ' sent')),
    )

    const admin = await signIn('admin')
    const box = (await admin.get('/api/admin/pushbox').expect(200)).body.items
    expect(box.length).toBe(pushes.messages().length)
    await angler.delete('/api/me/push').send({ endpoint: phone.endpoint }).expect(204)
    await angler.delete(`/api/watches/${pushed.id}`).expect(204)
  })

  it('lists alerts for admins', async () => {
    const admin = await signIn('admin')
    const res = await admin.get('/api/admin/alerts').expect(200)
    const items = res.body.items.map((x: unknown) => SentAlert.parse(x))
    expect(items.some((a: SentAlert) => a.kind === 'trip' && a.delivered.includes('email'))).toBe(
      true,
    )
    await (await signIn('angler')).get('/api/admin/alerts').expect(403)
  })
})
