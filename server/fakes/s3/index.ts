import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import S3rver from 's3rver'

/** s3rver's fixed credentials: the SDK signs with them, the stand-in checks them. */
export const S3RVER_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }

/**
 * The local stand-in for hosted object storage (s3rver) on 127.0.0.1, with the bucket made.
 * Objects live in `directory` (npm start keeps them under .data/); without one, in a temporary
 * folder removed on close (tests). Port 0 picks a free one.
 */
export async function startS3Server(opts: { bucket: string; port?: number; directory?: string }) {
  const directory = opts.directory ?? (await mkdtemp(join(tmpdir(), 'chopline-s3-')))
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port ?? 0,
    silent: true,
    directory,
    configureBuckets: [{ name: opts.bucket, configs: [] }],
  })
  const address = await server.run()
  return {
    url: `http://127.0.0.1:${address.port}`,
    bucket: opts.bucket,
    credentials: S3RVER_CREDENTIALS,
    close: async () => {
      await server.close()
      if (!opts.directory) await rm(directory, { recursive: true, force: true })
    },
  }
}
export type S3Stand = Awaited<ReturnType<typeof startS3Server>>
