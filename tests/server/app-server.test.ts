import { once } from 'node:events'
import type { IncomingMessage, ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import express from 'express'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { createAppServer } from '../../server/http/server'

const app = express()
app.use(express.json())
app.post('/echo', (req, res) => {
  // Express's own request and response methods, and the app they belong to.
  res.status(201).json({ body: req.body, host: req.get('host'), sameApp: req.app === app })
})
const server = createAppServer(app)
const born: { req?: object | null; res?: object | null } = {}
// Runs before express sees the request: what Node created the two objects as.
server.prependListener('request', (req: IncomingMessage, res: ServerResponse) => {
  born.req = Object.getPrototypeOf(req) as object | null
  born.res = Object.getPrototypeOf(res) as object | null
})
let base = ''

beforeAll(async () => {
  server.listen(0, '127.0.0.1')
  await once(server, 'listening')
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
})
afterAll(() => server.close())

it('creates requests and responses as the app’s own, so express never re-parents them', async () => {
  const res = await fetch(`${base}/echo`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ depthM: 3 }),
  })
  expect(res.status).toBe(201)
  expect(await res.json()).toEqual({
    body: { depthM: 3 },
    host: new URL(base).host,
    sameApp: true,
  })
  // Express sets these prototypes on every request it handles; born with them, nothing changes.
  expect(born.req).toBe(app.request)
  expect(born.res).toBe(app.response)
})
