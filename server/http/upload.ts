import multer from 'multer'
import type { RequestHandler } from 'express'
import { z } from 'zod'
import { badFile, HttpError } from './errors'

/** `?commit=true` saves an upload; without it the upload is only checked and reported. */
export const ImportQuery = z.object({ commit: z.enum(['true', 'false']).default('false') })

/**
 * One uploaded file in field `file`, held in memory (never written to disk, so its name is never
 * a path): at most `maxBytes`, with one of `extensions`. Anything else is a 4xx with a message.
 */
export function singleUpload(opts: { maxBytes: number; extensions: string[] }): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    // Keep the name as sent, so a name with a path in it is refused rather than cut down.
    preservePath: true,
    limits: { fileSize: opts.maxBytes, files: 1, fields: 10 },
    fileFilter: (_req, file, done) => {
      const name = file.originalname
      // A name that could climb out of a folder, or hide: refused, though it is never used as a path.
      if (/[/\\]|\.\.|^\./.test(name) || [...name].some((c) => c.charCodeAt(0) < 32))
        return done(
          badFile(
            'bad_file_name',
            `"${name.slice(0, 60)}" is not a plain file name.`,
            'Rename the file and try again.',
          ),
        )
      const ext = name.toLowerCase().slice(name.lastIndexOf('.'))
      if (!opts.extensions.includes(ext))
        return done(
          badFile(
            'unsupported_file',
            `Upload a ${opts.extensions.join(' or ')} file.`,
            undefined,
            415,
          ),
        )
      done(null, true)
    },
  }).single('file')
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        const message =
          err.code === 'LIMIT_FILE_SIZE'
            ? `The file is larger than ${Math.round(opts.maxBytes / 1024)} kB.`
            : 'Send one file, in the field "file".'
        return next(
          badFile('bad_upload', message, message, err.code === 'LIMIT_FILE_SIZE' ? 413 : 400),
        )
      }
      if (err instanceof HttpError) return next(err)
      // busboy's own: a body cut short, a bad part header, no boundary. The sender's fault.
      if (err)
        return next(badFile('bad_upload', 'The upload could not be read; send the file again.'))
      if (!req.file) return next(badFile('bad_upload', 'Choose a file to upload.'))
      next()
    })
  }
}
