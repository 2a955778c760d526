// Photo uploads: multer keeps the file in memory within the size limit; the type is judged by its
// first bytes; the file goes under DATA_DIR/uploads with a random name (never the uploaded one).
import { randomBytes } from 'node:crypto';
import { mkdir, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import multer from 'multer';
import type { RequestHandler } from 'express';
import { AppError, badRequest } from '../../lib/errors';
import { IMAGE_EXTENSIONS, sniffImageType } from '../../../shared/checks/image-type';
import { PHOTO_MAX_BYTES, PHOTO_TYPES } from '../../../shared/api/work-orders';

export const uploadsDir = (dataDir: string) => resolve(dataDir, 'uploads');

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 5 } }).single('photo');

/** multer's own errors become the API's error shape (413 for a file over the limit). */
export const receivePhoto: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new AppError('payload_too_large', 413, `A photo may be at most ${PHOTO_MAX_BYTES / (1024 * 1024)} MB`));
      return next(badRequest(`Upload refused: ${err.message} (send one file in the field "photo")`));
    }
    next(err);
  });
};

export async function storePhoto(dataDir: string, file: Express.Multer.File | undefined) {
  if (!file) throw badRequest('No photo: send one image file in the multipart field "photo"');
  const mime = sniffImageType(file.buffer);
  if (!mime) throw new AppError('unsupported_media_type', 415, `Only ${PHOTO_TYPES.join(', ')} photos are accepted (judged by the file's content)`);
  const dir = uploadsDir(dataDir);
  await mkdir(dir, { recursive: true });
  const storedName = `${randomBytes(16).toString('hex')}.${IMAGE_EXTENSIONS[mime]}`;
  await writeFile(join(dir, storedName), file.buffer, { flag: 'wx' });
  const originalName = (file.originalname || 'photo').replace(/[^\p{L}\p{N} ._-]/gu, '_').slice(0, 255);
  return { storedName, originalName, mime, sizeBytes: file.size };
}
