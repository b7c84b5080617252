import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { IMPORT_KINDS, IMPORT_MAX_BYTES, type ImportKind } from '../../src/contracts/imports';
import type { Role } from '../../src/contracts/roles';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { HttpError, badRequest } from '../http/errors';
import * as imports from './service';

/** Who may import what: the roles of the form each import stands in for. */
export const IMPORT_ROLES: Record<ImportKind, Role[]> = {
  customers: ['office', 'admin'],
  spools: ['office', 'engineer', 'admin'],
  orders: ['office', 'admin'],
};

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 5, fieldSize: 1_000 } }).single('file');
const receiveCsv: RequestHandler = (req, res, next) =>
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
      return next(new HttpError(413, 'payload_too_large', `The file is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB`, { file: 'Split the file' }));
    }
    next(new HttpError(400, 'validation', 'Send one CSV file in the form field "file"', { file: 'Choose a CSV file' }));
  });

function fileOf(req: Parameters<RequestHandler>[0]): Buffer {
  const file = (req as { file?: Express.Multer.File }).file;
  if (!file) throw badRequest('Attach the CSV file as the form field "file"', { file: 'Choose a CSV file' });
  return file.buffer;
}

export function importsRouter(db: Db) {
  const r = Router();
  for (const kind of IMPORT_KINDS) {
    const roles = IMPORT_ROLES[kind];
    r.get(`/imports/${kind}/columns`, allow(...roles), (req, res) => {
      res.json(imports.columns(kind, currentUser(req)));
    });
    r.get(`/imports/${kind}/template.csv`, allow(...roles), (req, res) => {
      res.type('text/csv; charset=utf-8').attachment(`spoolwright-${kind}-template.csv`).send(imports.template(kind, currentUser(req)));
    });
    r.post(`/imports/${kind}/dry-run`, allow(...roles), receiveCsv, async (req, res) => {
      res.json(await imports.dryRun(db, kind, fileOf(req), currentUser(req)));
    });
    r.post(`/imports/${kind}/commit`, allow(...roles), receiveCsv, async (req, res) => {
      res.status(201).json(await imports.commit(db, kind, fileOf(req), currentUser(req)));
    });
  }
  return r;
}
