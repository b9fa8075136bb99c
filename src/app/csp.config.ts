// The ship server's origin in the Content-Security-Policy. The policy is a meta tag in
// index.html and names only 'self' for connections; the sync (src/sync) needs the ship server
// too. The origin is fixed when the app is built: `FLOE_SHIP_SERVER=http://192.168.1.10:5984
// npm start` (several separated by commas). Never a wildcard: a laptop talks to its own ship's
// server and nothing else. docs/dev/sync.md, "The security policy".
import type { Plugin } from 'vite';

/** The origins in the variable, checked: http(s), a host, no path, no wildcard. Throws with the bad part named. */
export function shipServerOrigins(value: string | undefined): string[] {
  if (value === undefined || value.trim() === '') return [];
  return value.split(',').map((raw) => {
    const v = raw.trim();
    if (v.includes('*')) throw new Error(`FLOE_SHIP_SERVER: "${v}" has a wildcard; name the server's address`);
    let u: URL;
    try {
      u = new URL(v);
    } catch {
      throw new Error(`FLOE_SHIP_SERVER: "${v}" is not an address such as http://192.168.1.10:5984`);
    }
    if (u.protocol !== 'http:' && u.protocol !== 'https:') throw new Error(`FLOE_SHIP_SERVER: "${v}" must start with http:// or https://`);
    if (u.username || u.password) throw new Error(`FLOE_SHIP_SERVER: "${v}" must not hold a user or password`);
    if (u.pathname !== '/' || u.search || u.hash) throw new Error(`FLOE_SHIP_SERVER: "${v}" must be an origin only (no path)`);
    return u.origin;
  });
}

/** The policy text with the origins added to connect-src. */
export function withShipServers(html: string, origins: readonly string[]): string {
  if (origins.length === 0) return html;
  const out = html.replace(/(connect-src 'self'[^;"]*)/, (m) => `${m} ${origins.join(' ')}`);
  if (out === html) throw new Error('index.html has no connect-src to add the ship server to');
  return out;
}

export function shipServerCsp(origins: readonly string[]): Plugin {
  return {
    name: 'floe:ship-server-csp',
    apply: 'build',
    transformIndexHtml(html) {
      return withShipServers(html, origins);
    },
  };
}
