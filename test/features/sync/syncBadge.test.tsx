// What the header says for each sync state, and the settings panel of a build with no ship
// server in its policy.
import { render, screen } from '@testing-library/react';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { SyncStatus } from '../../../src/sync/engine';
import { syncText } from '../../../src/features/sync/SyncBadge';
import { SyncPanel } from '../../../src/features/sync/SyncPanel';

const base: SyncStatus = { phase: 'synced', waiting: 0, troubleSince: null, reason: null, refusedDocs: [], progress: null, lastSyncedAt: null, retryAt: null };

describe('the sync state in words', () => {
  it('synced, waiting, receiving with progress, offline since, refused with why', () => {
    expect(syncText(base).text).toBe('Synced with the ship server');
    expect(syncText({ ...base, waiting: 3 }).text).toBe('Ship server: 3 waiting to send');
    expect(syncText({ ...base, phase: 'receiving', progress: { received: 500, total: 2000 } }).text).toBe('Receiving from the ship server: 500 of 2000 documents');
    const off = syncText({ ...base, phase: 'offline', waiting: 2, troubleSince: '2026-03-10T04:12:00Z', reason: 'the ship server cannot be reached' });
    expect(off.text).toBe('Ship server offline since 04:12 UTC, 2 waiting to send');
    expect(off.tone).toBe('trouble');
    expect(off.detail).toBe('the ship server cannot be reached');
    const refused = syncText({ ...base, phase: 'refused', reason: 'sign in again' });
    expect(refused.text).toBe('Ship server refused');
    expect(refused.detail).toBe('sign in again');
  });
});

describe('the ship server settings', () => {
  it('say that a build without FLOE_SHIP_SERVER may connect to no server, and never keep a password field filled', async () => {
    const meta = document.createElement('meta');
    meta.httpEquiv = 'Content-Security-Policy';
    meta.content = "default-src 'self'; connect-src 'self' blob:";
    document.head.append(meta);
    render(<SyncPanel />);
    expect(await screen.findByText(/may not connect to any ship server/)).toBeTruthy();
    meta.remove();
    expect((screen.getByLabelText(/Password/) as HTMLInputElement).type).toBe('password');
    expect((screen.getByRole('button', { name: /Sign in and switch sync on/ }) as HTMLButtonElement).disabled).toBe(true);
  });
});

describe('the observation list with a ship server', () => {
  // jsdom lays nothing out: give the scrolling list a size so the virtualiser renders rows.
  const heightSpy = vi.spyOn(HTMLElement.prototype, 'clientHeight', 'get');
  const widthSpy = vi.spyOn(HTMLElement.prototype, 'clientWidth', 'get');
  beforeAll(() => {
    heightSpy.mockReturnValue(420);
    widthSpy.mockReturnValue(900);
  });
  afterAll(() => {
    heightSpy.mockRestore();
    widthSpy.mockRestore();
  });

  it('marks each observation: its current revision on the server, or waiting', async () => {
    const { ObservationList } = await import('../../../src/features/log/ObservationList');
    const { sampleBundle } = await import('../../format/arbitraries');
    const b = sampleBundle();
    const [first] = b.observations;
    const second = { ...first!, id: 'o-2', time: '2026-03-02T11:00:00Z', revision: 1 };
    render(<ObservationList cruise={b.cruise} observations={[first!, second]} onEdit={() => undefined} onHistory={() => undefined} onServer={new Map([[first!.id, first!.revision], ['o-2', 0]])} />);
    const marks = screen.getAllByTestId('server-mark').map((m) => m.textContent?.trim());
    // Newest first: o-2 (waiting), then the first (on the server).
    expect(marks).toEqual(['waiting', 'on server']);
  });

  it('shows no mark when sync is off', async () => {
    const { ObservationList } = await import('../../../src/features/log/ObservationList');
    const { sampleBundle } = await import('../../format/arbitraries');
    const b = sampleBundle();
    render(<ObservationList cruise={b.cruise} observations={b.observations} onEdit={() => undefined} onHistory={() => undefined} />);
    expect(screen.queryAllByTestId('server-mark')).toEqual([]);
  });
});
