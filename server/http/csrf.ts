import type { RequestHandler } from 'express';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import { isTokenRequest } from './bearer';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request defence: a state-changing request must carry `X-Requested-By: spoolwright`.
 * A browser cannot add a custom header to a cross-site form post or simple request, so a page on
 * another site cannot act with the user's cookie. Multipart uploads are covered the same way.
 * Requests with an API token are exempt: a browser never adds the Authorization header by itself,
 * so a token request cannot be forged from another site.
 */
export const requireCsrfHeader: RequestHandler = (req, res, next) => {
  if (SAFE.has(req.method) || isTokenRequest(req)) return next();
  if (req.get(CSRF_HEADER) === CSRF_VALUE) return next();
  res.status(403).json({
    error: { code: 'csrf', message: `State-changing requests must carry the header ${CSRF_HEADER}: ${CSRF_VALUE}` },
  });
};
