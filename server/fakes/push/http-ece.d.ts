declare module 'http_ece' {
  import type { ECDH } from 'node:crypto'
  /** RFC 8188 decryption; for Web Push (aes128gcm) the sender's key is in the record header. */
  export function decrypt(
    buffer: Buffer,
    params: { version: 'aes128gcm'; privateKey: ECDH; authSecret: string | Buffer },
  ): Buffer
}
