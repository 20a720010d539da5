import {
  DeleteObjectsCommand,
  GetObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3'

export interface PhotoStoreConfig {
  url: string
  bucket: string
  region: string
  credentials: { accessKeyId: string; secretAccessKey: string }
}

/** Catch photos in object storage through the S3 API: a real provider, or the local stand-in. */
export function photoStore(config: PhotoStoreConfig) {
  const client = new S3Client({
    endpoint: config.url,
    region: config.region,
    credentials: config.credentials,
    // Bucket in the path, not the host name: what the stand-in and most other providers accept.
    forcePathStyle: true,
  })
  const Bucket = config.bucket
  return {
    async put(key: string, body: Buffer, contentType: string) {
      await client.send(
        new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType }),
      )
    },
    async get(key: string): Promise<Buffer> {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: key }))
      return Buffer.from(await res.Body!.transformToByteArray())
    },
    async remove(keys: string[]) {
      if (keys.length)
        await client.send(
          new DeleteObjectsCommand({ Bucket, Delete: { Objects: keys.map((Key) => ({ Key })) } }),
        )
    },
    close: () => client.destroy(),
  }
}
export type PhotoStore = ReturnType<typeof photoStore>
