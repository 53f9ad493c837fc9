import type { RequestHandler } from 'express';
import pino, { type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

const REDACTED = '[redacted]';

/**
 * Query parameters that carry a secret: the one-time tokens of reset, invitation and e-mail
 * confirmation links (`?token=`), and anything named like a password or a secret.
 */
const SECRET_PARAM = /token|passw|secret/i;
/** Headers that carry a session or a credential, in either direction. */
const SECRET_HEADERS = new Set(['cookie', 'set-cookie', 'authorization', 'proxy-authorization']);
/** Headers that carry an address of this app, with whatever query it had. */
const URL_HEADERS = new Set(['referer', 'location']);

/**
 * Paths (or whole addresses, as in a Referer) that carry a secret in a segment: a calendar feed's
 * token (`/api/calendar/<token>.ics`) and a packet page's (`/p/<token>`).
 */
const SECRET_PATH = /^((?:[a-z][a-z\d+.-]*:\/\/[^/?#]*)?\/(?:api\/calendar|p)\/)[^/?#]+?(\.ics)?(?=[/?#]|$)/i;

/** The URL as logged: a secret path segment and every secret query parameter's value replaced, the rest as it came. */
export function redactUrl(logged: string): string {
  const url = logged.replace(SECRET_PATH, `$1${REDACTED}$2`);
  const at = url.indexOf('?');
  if (at < 0) return url;
  const hash = url.indexOf('#', at);
  const query = url.slice(at + 1, hash < 0 ? undefined : hash);
  const parts = query.split('&').map((part) => {
    const eq = part.indexOf('=');
    const name = eq < 0 ? part : part.slice(0, eq);
    let decoded = name;
    try {
      decoded = decodeURIComponent(name.replace(/\+/g, ' '));
    } catch {
      // A malformed escape: judge the name as written.
    }
    return eq >= 0 && SECRET_PARAM.test(decoded) ? `${name}=${REDACTED}` : part;
  });
  return `${url.slice(0, at)}?${parts.join('&')}`;
}

type Headers = Record<string, unknown>;

function headersForLog(headers: Headers): Headers {
  const safe: Headers = {};
  for (const [name, value] of Object.entries(headers)) {
    const lower = name.toLowerCase();
    if (SECRET_HEADERS.has(lower)) safe[name] = REDACTED;
    else if (URL_HEADERS.has(lower) && typeof value === 'string') safe[name] = redactUrl(value);
    else safe[name] = value;
  }
  return safe;
}

interface LoggedRequest {
  id?: unknown;
  method?: unknown;
  url?: unknown;
  headers?: Headers;
  remoteAddress?: unknown;
  remotePort?: unknown;
}

/**
 * What of a request reaches the log: an allowlist, so the parsed query (which holds a link's
 * token) and the body never do, and the URL and headers only with their secrets replaced. Takes
 * pino-http's serialized request or the error handler's own `{ method, url }`.
 */
function requestForLog(req: LoggedRequest) {
  return {
    id: req.id,
    method: req.method,
    url: typeof req.url === 'string' ? redactUrl(req.url) : undefined,
    headers: req.headers ? headersForLog(req.headers) : undefined,
    remoteAddress: req.remoteAddress,
    remotePort: req.remotePort,
  };
}

function responseForLog(res: { statusCode?: unknown; headers?: Headers }) {
  return { statusCode: res.statusCode, headers: res.headers ? headersForLog(res.headers) : undefined };
}

/** An error as logged (already serialized), without the raw body some body parsers attach. */
function withoutBody<E extends object>(serialized: E): E {
  if ('body' in serialized) Object.assign(serialized, { body: REDACTED });
  return serialized;
}

/**
 * Per-request logging, with no secret in it: no session cookie either way, no credential header,
 * no token or password in a URL (see requestForLog). pino-http writes a line per request at `info`
 * (when autoLogging is on) and gives each request req.log, a child logger that serializes the
 * request as soon as it arrives. Where the level leaves out `info` (warn, error, silent) nothing
 * of that would ever be written, so req.log is the app's logger with the same serializers, and the
 * error handler names the request in its own line.
 */
export function requestLogging(logger: Logger, autoLogging: boolean): RequestHandler {
  if (logger.isLevelEnabled('info')) {
    // pino-http runs its own serializers first and hands these their result.
    return pinoHttp({
      logger,
      autoLogging,
      serializers: { req: requestForLog, res: responseForLog, err: withoutBody },
    });
  }
  const quiet = logger.child(
    {},
    {
      serializers: {
        req: requestForLog,
        err: (error: Error) => withoutBody(pino.stdSerializers.err(error)),
      },
    },
  );
  return (req, _res, next) => {
    req.log = quiet;
    next();
  };
}
