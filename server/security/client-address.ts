import type { RequestHandler } from 'express';

/**
 * The request header through which better-auth learns the client's address (its rate limiter
 * and the `ip_address` of each session). Set by `clientAddressHeader` on every request, so a
 * value sent by the client never survives.
 */
export const CLIENT_ADDRESS_HEADER = 'x-emberline-client-address';

/**
 * Puts Express's `req.ip` in CLIENT_ADDRESS_HEADER, replacing whatever the client sent.
 *
 * One rule decides the client's address for every consumer: Express's `trust proxy` setting
 * (TRUST_PROXY). Without it `req.ip` is the connection's peer and X-Forwarded-For is ignored;
 * behind a load balancer TRUST_PROXY names it, and `req.ip` is the first address that is not a
 * trusted proxy (Express 5 documentation, "Express behind proxies"). express-rate-limit reads
 * `req.ip` itself; better-auth reads headers only (by default the X-Forwarded-For a client can
 * write, and with none it would put every client in one shared rate-limit bucket), so it is
 * pointed at this header.
 */
export function clientAddressHeader(): RequestHandler {
  return (req, _res, next) => {
    const ip = req.ip;
    if (ip) req.headers[CLIENT_ADDRESS_HEADER] = ip;
    else delete req.headers[CLIENT_ADDRESS_HEADER];
    next();
  };
}
