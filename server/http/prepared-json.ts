import etag from 'etag'
import type { Response } from 'express'

/**
 * A JSON answer made once and sent many times (a kept Lake read or Day plan): its bytes, and the
 * weak ETag express would otherwise hash out of them again on every response.
 */
export interface PreparedJson {
  body: Buffer
  etag: string
}

export function prepareJson(json: string): PreparedJson {
  const body = Buffer.from(json)
  return { body, etag: etag(body, { weak: true }) }
}

/** Sends it; express still answers 304 to a client whose copy has this ETag. */
export function sendPrepared(res: Response, answer: PreparedJson) {
  res.type('json').set('ETag', answer.etag).send(answer.body)
}
