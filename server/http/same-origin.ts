import type { RequestHandler } from 'express';
import { HttpError } from './errors';

/** Methods that only read; every other method changes something and is checked. */
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** An origin as browsers send it in the Origin header: scheme://host[:port], no path, no trailing slash. */
function normalizeOrigin(value: string): string {
  return new URL(value).origin;
}

/**
 * Refuses state-changing API requests (POST, PUT, PATCH, DELETE, ...) sent by a page of another
 * site, so a signed-in user's session cookie cannot be used by that page (cross-site request
 * forgery). SameSite=Lax on the session cookie already keeps it off most cross-site requests;
 * this is the second, server-side check.
 *
 * Refused with 403 when:
 * - the Origin header is present and is not one of `trustedOrigins` (an opaque origin, sent as
 *   the string "null", is never trusted), or
 * - the browser states `Sec-Fetch-Site: cross-site`.
 *
 * A request without an Origin header passes: browsers always send Origin on a cross-site POST,
 * PUT, PATCH or DELETE, so a missing Origin means a client that is not a browser page
 * (`npm run plan:once`, curl, scripts, tests), which holds no victim's cookie to abuse.
 * Reads (GET, HEAD, OPTIONS) pass: they change nothing, and without CORS headers the browser
 * does not let the other site read the answer.
 */
export function sameOriginOnly(trustedOrigins: readonly string[]): RequestHandler {
  const trusted = new Set(trustedOrigins.map(normalizeOrigin));
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    const fetchSite = req.get('sec-fetch-site');
    if (fetchSite === 'cross-site' || (origin !== undefined && !trusted.has(origin))) {
      throw new HttpError('forbidden', 'Refused: this request came from another site');
    }
    next();
  };
}
