import { gzipSync } from 'node:zlib'
import etag from 'etag'
import type { Response } from 'express'

/**
 * A JSON answer made once and sent many times (a kept Lake read or Day plan): its bytes, its gzip
 * (made on first asking, then kept), and the weak ETag express would otherwise hash out of them
 * again on every response. Phones ask for gzip; compressing each response doubled the CPU one of
 * these cost.
 */
export class PreparedJson {
  readonly etag: string
  #gzip: Buffer | undefined

  constructor(readonly body: Buffer) {
    this.etag = etag(body, { weak: true })
  }

  get gzip(): Buffer {
    return (this.#gzip ??= gzipSync(this.body))
  }
}

export const prepareJson = (data: unknown) => new PreparedJson(Buffer.from(JSON.stringify(data)))

/**
 * Sends it, gzipped for a client that takes gzip (the compression middleware leaves an answer
 * that already has a Content-Encoding alone); express still answers 304 to a client whose copy
 * has this ETag.
 */
export function sendPrepared(res: Response, answer: PreparedJson) {
  res.type('json').set('ETag', answer.etag).vary('Accept-Encoding')
  // Below the compression middleware's own threshold gzip saves nothing.
  if (answer.body.length >= 1024 && res.req.acceptsEncodings('gzip', 'identity') === 'gzip') {
    res.set('Content-Encoding', 'gzip').send(answer.gzip)
  } else {
    res.send(answer.body)
  }
}
