import type { Request, Response } from 'express';
import multer from 'multer';
import { BadRequest, HttpError } from '../errors';

/**
 * A one-file multipart receiver kept in memory with a size limit: over the limit → 413 naming the
 * limit, a wrong file → 400 from `check`, no file → 400. Run it inside the handler, after the
 * membership and permission guards, so nobody without the permission makes the server read an
 * upload (the pattern of routes/lab-imports.ts, shared here for new uploads).
 */
export function fileReceiver(options: {
  maxBytes: number;
  /** Other multipart text fields allowed besides the file. */
  fields: number;
  /** "the noise log", "the lab results": used in messages. */
  what: string;
  /** Returns an error to refuse the file by its name and type, or null to accept it. */
  check: (file: { originalname: string; mimetype: string }) => BadRequest | null;
}): (req: Request, res: Response) => Promise<Express.Multer.File> {
  const upload = multer({
    storage: multer.memoryStorage(),
    defParamCharset: 'utf8',
    limits: { fileSize: options.maxBytes, files: 1, fields: options.fields, parts: options.fields + 1 },
    fileFilter: (_req, file, accept) => {
      const refusal = options.check(file);
      if (refusal) accept(refusal);
      else accept(null, true);
    },
  }).single('file');
  const megabytes = options.maxBytes / 1024 / 1024;
  return (req, res) =>
    new Promise((resolve, reject) => {
      upload(req, res, (error: unknown) => {
        if (error instanceof multer.MulterError) {
          if (error.code === 'LIMIT_FILE_SIZE')
            return reject(
              new HttpError(413, 'payload_too_large', `The file is larger than the limit of ${megabytes} MB for ${options.what}; nothing was stored`),
            );
          return reject(new BadRequest(`Send one file in the form field "file" (${error.message})`, { file: 'Send one CSV file in the field "file"' }));
        }
        if (error) return reject(error);
        if (!req.file) return reject(new BadRequest(`Attach ${options.what} as a CSV file in the multipart form field "file"`, { file: 'Attach a CSV file' }));
        resolve(req.file);
      });
    });
}
