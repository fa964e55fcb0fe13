/**
 * Which Host and Origin values the local server answers to: the bound address, localhost, 127.0.0.1 and [::1],
 * each with the listening port (any port before the server listens, e.g. under fastify.inject).
 */

export interface HostPolicy {
  /** lower-case host names without port, IPv6 in brackets */
  names: ReadonlySet<string>;
  /** the port the server listens on, or null when unknown (not listening yet) */
  port: () => number | null;
}

const LOOPBACK_NAMES = ['localhost', '127.0.0.1', '[::1]'];

function bracketIpv6(host: string): string {
  return host.includes(':') && !host.startsWith('[') ? `[${host}]` : host;
}

export function createHostPolicy(boundHost: string, port: () => number | null): HostPolicy {
  const names = new Set(LOOPBACK_NAMES);
  if (boundHost !== '0.0.0.0' && boundHost !== '::') names.add(bracketIpv6(boundHost.toLowerCase()));
  return { names, port };
}

/** Split "name:port" (or "[v6]:port") into its parts; null when malformed. */
export function parseHostHeader(value: string): { name: string; port: number | null } | null {
  const match = /^(\[[0-9a-f:.]+\]|[a-z0-9.-]+)(?::(\d{1,5}))?$/i.exec(value.trim());
  if (match === null) return null;
  const name = (match[1] as string).toLowerCase();
  const port = match[2] === undefined ? null : Number(match[2]);
  return { name, port };
}

/** True when a Host header value names this server. */
export function isAllowedHost(policy: HostPolicy, value: string | undefined): boolean {
  if (value === undefined || value === '') return false;
  const parsed = parseHostHeader(value);
  if (parsed === null || !policy.names.has(parsed.name)) return false;
  const listening = policy.port();
  if (listening === null) return true;
  return parsed.port === null ? listening === 80 : parsed.port === listening;
}

/** True when an Origin header value ("http://host:port") is this server's own origin. */
export function isAllowedOrigin(policy: HostPolicy, value: string): boolean {
  let url: URL;
  try {
    url = new URL(value);
  } catch {
    return false;
  }
  if (url.protocol !== 'http:' || url.username !== '' || url.password !== '' || url.pathname !== '/') return false;
  return isAllowedHost(policy, url.host);
}
