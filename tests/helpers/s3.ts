import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
import { startS3Server } from '../../server/fakes/s3/index'
import { photoStore } from '../../server/features/journal/photo-store'

/** The local S3 stand-in on a free port with its bucket, a photo store on it, and a key lister. */
export async function startTestS3(bucket = 'test-photos') {
  const s3 = await startS3Server({ bucket })
  const config = { url: s3.url, bucket, region: 'us-east-1', credentials: s3.credentials }
  const photos = photoStore(config)
  const client = new S3Client({
    endpoint: s3.url,
    region: config.region,
    credentials: s3.credentials,
    forcePathStyle: true,
  })
  return {
    photos,
    /** Every key in the bucket. */
    keys: async () =>
      ((await client.send(new ListObjectsV2Command({ Bucket: bucket }))).Contents ?? []).map(
        (o) => o.Key!,
      ),
    close: async () => {
      photos.close()
      client.destroy()
      await s3.close()
    },
  }
}
export type TestS3 = Awaited<ReturnType<typeof startTestS3>>
