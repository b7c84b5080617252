import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { pipeline } from 'node:stream/promises';
import { ATTACHMENT_MAX_BYTES, attachmentUploadFields } from '../../src/contracts/orders';
import type { Db } from '../db/client';
import type { Storage } from '../infra/storage';
import { allow, currentUser } from '../http/access';
import { HttpError, idParam, parse } from '../http/errors';
import { ORDER_READERS } from '../orders/router';
import * as attachments from './service';

/** One file in the field `file`, held in memory (never on the API's disk), up to 25 MB. */
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: ATTACHMENT_MAX_BYTES, files: 1, fields: 10, fieldSize: 10_000 },
  defParamCharset: 'utf8',
}).single('file');

const receiveFile: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        return next(new HttpError(413, 'payload_too_large', 'The file is larger than 25 MB', { file: 'Files may be up to 25 MB' }));
      }
      const field = err.field && err.field !== 'file' ? err.field : 'file';
      return next(new HttpError(400, 'validation', 'Send one file in the field "file"', { [field]: 'Send one file in the field "file"' }));
    }
    next(new HttpError(400, 'validation', 'The upload was cut short or malformed', { file: 'The upload was cut short or malformed' }));
  });
};

export function attachmentsRouter(db: Db, storage: Storage) {
  const r = Router();
  r.post('/orders/:id/attachments', allow('office', 'admin'), receiveFile, async (req, res) => {
    const orderId = idParam(req.params.id);
    const { lineId } = parse(attachmentUploadFields, req.body ?? {});
    const created = await attachments.uploadAttachment(db, storage, currentUser(req), orderId, req.file, lineId);
    res.status(201).json(created);
  });
  /** The bytes as stored, with the type the content showed; `?inline=1` for a preview. */
  r.get('/attachments/:id', allow(...ORDER_READERS), async (req, res) => {
    const { attachment, body } = await attachments.openAttachment(db, storage, currentUser(req), idParam(req.params.id));
    res.status(200);
    res.attachment(attachment.filename); // sets Content-Disposition (and a type by extension, replaced next)
    // ?inline=1 lets a client preview a PDF or image in the browser instead of saving it.
    if (req.query.inline === '1') res.setHeader('Content-Disposition', String(res.getHeader('Content-Disposition')).replace(/^attachment/, 'inline'));
    res.setHeader('Content-Type', attachment.contentType); // the type the content showed, not the name
    res.setHeader('Content-Length', String(attachment.size));
    res.setHeader('Cache-Control', 'private, no-store');
    try {
      await pipeline(body, res);
    } catch {
      res.destroy(); // the client went away or the store broke off mid-stream
    }
  });
  r.delete('/attachments/:id', allow('office', 'admin'), async (req, res) => {
    await attachments.deleteAttachment(db, storage, currentUser(req), idParam(req.params.id));
    res.status(204).end();
  });
  return r;
}
