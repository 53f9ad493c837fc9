import type { RequestHandler } from 'express';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';

/**
 * Per-request logging. pino-http writes a line per request at `info` (when autoLogging is on) and
 * gives each request req.log, a child logger that serializes the request as soon as it arrives.
 * Where the level leaves out `info` (warn, error, silent) nothing of that would ever be written,
 * so req.log is the app's logger itself and the error handler names the request in its own line.
 */
export function requestLogging(logger: Logger, autoLogging: boolean): RequestHandler {
  if (logger.isLevelEnabled('info')) {
    return pinoHttp({ logger, autoLogging, redact: ['req.headers.cookie'] });
  }
  return (req, _res, next) => {
    req.log = logger;
    next();
  };
}
