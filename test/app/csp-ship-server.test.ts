// The ship server's origin in the Content-Security-Policy (src/app/csp.config.ts): added to
// connect-src only, never a wildcard, bad values refused with the bad part named.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { shipServerOrigins, withShipServers } from '../../src/app/csp.config';

const html = readFileSync(resolve(import.meta.dirname, '../../index.html'), 'utf8');
const policy = (h: string) => /Content-Security-Policy" content="([^"]+)"/.exec(h)?.[1] ?? '';
const directive = (p: string, name: string) => p.split(';').map((d) => d.trim()).find((d) => d.startsWith(`${name} `)) ?? '';

describe('the ship server in the security policy', () => {
  it('without FLOE_SHIP_SERVER the policy connects to the app itself only', () => {
    expect(shipServerOrigins(undefined)).toEqual([]);
    expect(withShipServers(html, [])).toBe(html);
    expect(directive(policy(html), 'connect-src')).toBe("connect-src 'self' blob:");
  });

  it('adds the origins, normalised, to connect-src and nowhere else', () => {
    const origins = shipServerOrigins('http://192.168.1.10:5984/, https://ship.example.org');
    expect(origins).toEqual(['http://192.168.1.10:5984', 'https://ship.example.org']);
    const p = policy(withShipServers(html, origins));
    expect(directive(p, 'connect-src')).toBe("connect-src 'self' blob: http://192.168.1.10:5984 https://ship.example.org");
    // 'wasm-unsafe-eval' lets the import worker compile the NetCDF-4 reader (h5wasm); nothing else runs code.
    expect(directive(p, 'script-src')).toBe("script-src 'self' 'wasm-unsafe-eval'");
    expect(p).not.toContain('*');
  });

  it('refuses wildcards, paths, credentials and other schemes', () => {
    expect(() => shipServerOrigins('http://*.ship:5984')).toThrow(/wildcard/);
    expect(() => shipServerOrigins('http://host:5984/db')).toThrow(/origin only/);
    expect(() => shipServerOrigins('http://u:p@host:5984')).toThrow(/user or password/);
    expect(() => shipServerOrigins('ws://host:5984')).toThrow(/http/);
    expect(() => shipServerOrigins('not an address')).toThrow(/not an address/);
  });
});
