import type { IncomingMessage } from 'node:http';
import type { RequestHandler } from 'express';
import proxyaddr from 'proxy-addr';

/** Whether the hop `addr`, `i` steps from the server, is a proxy to believe about the client's address. */
export type TrustProxy = (addr: string, i: number) => boolean;

/**
 * The `TRUST_PROXY` setting as Express reads `trust proxy`: unset or `false` believes no proxy (the client
 * is the connection's own address); a whole number believes that many hops; anything else is a
 * comma-separated list of addresses, subnets and the names `loopback`, `linklocal`, `uniquelocal`.
 * `true` (believe every hop, so any client could name its own address) is refused.
 */
export function compileTrustProxy(setting: string | undefined): TrustProxy {
  const value = setting?.trim() ?? '';
  if (value === '' || value === 'false') return () => false;
  if (value === 'true') throw new Error('TRUST_PROXY=true would believe any client about its own address; name the proxies or the number of hops');
  if (/^\d+$/.test(value)) {
    const hops = Number(value);
    return (_addr, i) => i < hops;
  }
  return proxyaddr.compile(value.split(',').map((s) => s.trim()).filter(Boolean));
}

/** The client's address of a request (HTTP, or a socket's handshake), past the proxies believed. */
export function clientAddress(req: IncomingMessage, trust: TrustProxy): string {
  return proxyaddr(req, trust);
}

/**
 * The header through which better-auth learns the client's address (for the sessions it records and its
 * own limiter). By default it believes the first address of X-Forwarded-For, which any client can write;
 * this header is set here from `req.ip`, over whatever the client sent.
 */
export const CLIENT_ADDRESS_HEADER = 'x-ledgerline-client-address';

export const setClientAddressHeader: RequestHandler = (req, _res, next) => {
  req.headers[CLIENT_ADDRESS_HEADER] = req.ip ?? '';
  next();
};
