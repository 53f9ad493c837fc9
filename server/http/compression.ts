import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import compression from 'compression';
import type { RequestHandler, Response } from 'express';

/**
 * Compressed answers for clients that ask for them (Accept-Encoding): brotli where accepted, else
 * gzip, for the client's files and the API alike; images and other already-compressed types, and
 * answers under 1 KB, go as they are. Brotli at quality 4 (the package's default; zlib's own, 11,
 * takes seconds on a large script): about gzip's size at about gzip's cost. The client's scripts
 * and styles are compressed harder once at build time instead (precompressedAssets).
 *
 * The middleware wraps res.write/res.end/res.writeHead, so later wrappers (forgetOnWrites, the
 * rate limiter's takeBackOnSuccess) sit on top of it and still see every answer end once. A
 * request without Accept-Encoding skips the wrappers altogether and costs only the Vary header.
 */
export function compressResponses(): RequestHandler {
  const compress = compression({
    threshold: 1024,
    brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 4 } },
  });
  return (req, res, next) => {
    if (req.headers['accept-encoding'] === undefined) {
      res.vary('Accept-Encoding');
      return next();
    }
    return compress(req, res, next);
  };
}

/** Vite's content-hashed output: a changed file gets a new name, so a copy never goes stale. */
const IMMUTABLE = 'public, max-age=31536000, immutable';

/**
 * Cache-Control for a file of the built client: a year and immutable for the hashed files under
 * assets/, and no-cache (revalidate with the ETag every time) for index.html and the other files,
 * whose names stay the same from one release to the next.
 */
export function staticCacheHeaders(staticDir: string) {
  const hashed = path.join(path.resolve(staticDir), 'assets') + path.sep;
  return (res: Response, filePath: string) => {
    res.setHeader('Cache-Control', path.resolve(filePath).startsWith(hashed) ? IMMUTABLE : 'no-cache');
  };
}

/** A built asset's name as Vite writes it (name-hash.ext); nothing else is looked up. */
const ASSET_NAME = /^\/assets\/([\w-]+(?:\.[\w-]+)*\.(?:js|css|svg))$/;

/**
 * The .br and .gz copies that the build wrote beside the client's assets (vite.config.ts),
 * sent as they are to a client that accepts them, brotli first; for other clients, and files
 * without a copy, the request goes on to express.static (and compressResponses). The copies are
 * listed once at start: a build made later is served, compressed on the fly, until a restart.
 */
export function precompressedAssets(staticDir: string): RequestHandler {
  const assets = path.join(path.resolve(staticDir), 'assets');
  const copies = new Set(fs.existsSync(assets) ? fs.readdirSync(assets) : []);
  return (req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || !req.headers['accept-encoding']) return next();
    const name = ASSET_NAME.exec(req.path)?.[1];
    if (!name) return next();
    // Brotli whenever accepted (the smaller), whatever order the header names them in.
    const encoding = ['br', 'gzip'].find((coding) => req.acceptsEncodings(coding) === coding);
    const suffix = encoding === 'br' ? '.br' : '.gz';
    if (!encoding || !copies.has(name + suffix)) return next();
    res.vary('Accept-Encoding');
    res.type(path.extname(name));
    res.setHeader('Content-Encoding', encoding);
    res.setHeader('Cache-Control', IMMUTABLE);
    res.sendFile(path.join(assets, name + suffix), { cacheControl: false }, (error) => {
      if (error) next(error);
    });
  };
}
