// The Web Serial path in real Chromium: src/gps bundled for the browser, reading invented NMEA
// (the demo cruise's track) from the fake serial device of the harness.
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build, type Rolldown } from 'vite';
import { launchChromium, collectConsoleErrors, type Browser } from './harness/browser';
import { serveDirectory, type StaticServer } from './harness/server';
import { demoNmeaLines, installFakeSerial } from './harness/fakeSerial';
import type * as WebSerial from '../../src/gps/webSerial';

declare global {
  interface Window {
    FloeGps: typeof WebSerial;
  }
}

async function bundleGps(): Promise<string> {
  const out = await build({
    configFile: false, logLevel: 'silent', root: resolve(import.meta.dirname, '../..'),
    build: { write: false, minify: false, lib: { entry: 'src/gps/webSerial.ts', formats: ['iife'], name: 'FloeGps' } },
  });
  const first = (Array.isArray(out) ? out[0] : out) as Rolldown.RolldownOutput;
  return first.output[0].code;
}

describe('GPS over Web Serial in Chromium (fake device)', () => {
  let dir: string;
  let server: StaticServer;
  let browser: Browser;
  let code: string;

  beforeAll(async () => {
    code = await bundleGps();
    dir = await mkdtemp(join(tmpdir(), 'floe-gps-e2e-'));
    await writeFile(join(dir, 'index.html'), '<!doctype html><title>gps</title><p>gps test page</p>');
    server = await serveDirectory(dir);
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
    await rm(dir, { recursive: true, force: true });
  });

  async function page(lines: string[], extra: { userCancels?: boolean } = {}) {
    const p = await browser.context.newPage();
    const errors = collectConsoleErrors(p);
    await installFakeSerial(p, { lines, intervalMs: 2, ...extra });
    await p.goto(server.url);
    await p.addScriptTag({ content: code });
    return { p, errors };
  }

  it('reads fixes at the chosen baud rate, counts a corrupted sentence, and sees the unplug', async () => {
    const lines = demoNmeaLines(30);
    lines.splice(10, 0, '$GPGGA,000900.00,7933.00000,N,00712.00000,E,1,11,0.8,12.0,M,,M,,*00');
    const { p, errors } = await page(lines);
    const result = await p.evaluate(async (expected) => {
      const port = await window.FloeGps.requestSerialPort(navigator.serial);
      if (!port) throw new Error('no port');
      const statuses: string[] = [];
      const conn = await window.FloeGps.connectSerialGps(port, { baudRate: 38400, onStatus: (s) => statuses.push(s) });
      while (window.__fakeSerial.linesSent() < expected) await new Promise((r) => setTimeout(r, 10));
      await new Promise((r) => setTimeout(r, 50));
      const before = { counts: structuredClone(conn.tracker.counts), fix: conn.fix(), baud: window.__fakeSerial.openedWith()?.baudRate };
      window.__fakeSerial.unplug();
      await conn.done;
      return { ...before, status: conn.status(), statuses };
    }, lines.length);
    expect(result.baud).toBe(38400);
    // 30 fixes x (RMC, GGA, VTG, HDT), plus the one with a wrong checksum.
    expect(result.counts).toMatchObject({ good: 120, bad: 1, ignored: 0 });
    expect(result.fix).toMatchObject({ time: '2026-03-09T00:29:00Z', fixQuality: 1, satellites: 11 });
    expect(result.fix!.lat).toBeGreaterThan(79.5);
    expect(result.status).toBe('disconnected');
    expect(result.statuses).toEqual(['opening', 'reading', 'disconnected']);
    expect(errors).toEqual([]);
    await p.close();
  });

  it('closes the port on request and treats a cancelled chooser as no port', async () => {
    const { p } = await page(demoNmeaLines(5));
    const closed = await p.evaluate(async () => {
      const port = await navigator.serial.requestPort();
      const conn = await window.FloeGps.connectSerialGps(port);
      await new Promise((r) => setTimeout(r, 30));
      await conn.close();
      return { status: conn.status(), open: window.__fakeSerial.isOpen(), baud: conn.baudRate };
    });
    expect(closed).toEqual({ status: 'closed', open: false, baud: 4800 });
    await p.close();
    const cancelled = await page([], { userCancels: true });
    expect(await cancelled.p.evaluate(() => window.FloeGps.requestSerialPort(navigator.serial))).toBeNull();
    await cancelled.p.close();
  });
});
