import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import compression from 'compression';
import express, { type RequestHandler, type Response, type Router } from 'express';

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
 * The headers a hashed script, style or font needs, and no more. Mounted before the security
 * headers of the pages (helmet): a content security policy, frame and referrer rules govern
 * documents, not the files a document loads, and on a slow phone's HTTP/1.1 connection each
 * response's headers travel uncompressed — about 0.6 KB on each of some 35 files of the first
 * visit. nosniff and same-origin resource policy do apply to scripts and stay. No ETag or
 * Last-Modified: an immutable file is never revalidated. No Accept-Ranges: it is fetched whole.
 */
function setAssetHeaders(res: Response) {
  res.setHeader('Cache-Control', IMMUTABLE);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cross-Origin-Resource-Policy', 'same-origin');
}

/**
 * Cache-Control for a file of the built client outside assets/ (index.html, the icons, the
 * manifest and the service worker), whose names stay the same from one release to the next:
 * no-cache, revalidated with the ETag every time.
 */
export function staticCacheHeaders(res: Response) {
  res.setHeader('Cache-Control', 'no-cache');
}

/** A built asset's name as Vite writes it (name-hash.ext); nothing else is looked up. */
const ASSET_NAME = /^\/([\w-]+(?:\.[\w-]+)*\.(?:js|css|svg))$/;

/**
 * /assets/: Vite's content-hashed files, with the headers of setAssetHeaders. The .br and .gz
 * copies that the build wrote beside them (vite.config.ts) go as they are to a client that accepts
 * them, brotli first; other clients and files without a copy get the file itself (compressed on
 * the fly when over 1 KB). The copies are listed once at start: a build made later is served,
 * compressed on the fly, until a restart. A name not there goes on to the rest of the app.
 */
export function hashedAssets(staticDir: string): Router {
  const assets = path.join(path.resolve(staticDir), 'assets');
  const copies = new Set(fs.existsSync(assets) ? fs.readdirSync(assets) : []);
  // express.static, not res.sendFile: sendFile puts back the app's ETag setting.
  const files = express.static(assets, {
    index: false,
    cacheControl: false,
    etag: false,
    lastModified: false,
    // Scripts and styles are fetched whole; no Accept-Ranges line on each.
    acceptRanges: false,
    setHeaders: setAssetHeaders,
  });
  const router = express.Router();
  router.use((req, res, next) => {
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
    // The copy's own type would be application/octet-stream; the file's type set here stays.
    req.url = `/${name}${suffix}`;
    return files(req, res, next);
  });
  router.use(compressResponses(), files);
  return router;
}
