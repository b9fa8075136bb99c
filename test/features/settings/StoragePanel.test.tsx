import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { closeFloeDb, getDb, onDatabaseEvent, selectDatabase, FloeDatabase, SCHEMA_VERSIONS } from '../../../src/db';
import { formatBytes, StoragePanel } from '../../../src/features/settings/StoragePanel';
import { DatabaseStatus } from '../../../src/features/settings/DatabaseStatus';

let n = 0;
let name = '';
beforeEach(() => {
  name = `floe-panel-${++n}`;
  selectDatabase(name);
});
afterEach(() => {
  closeFloeDb();
  Reflect.deleteProperty(navigator, 'storage');
});

function stubStorage(grant: boolean) {
  const calls = { persist: 0 };
  let persisted = false;
  Object.defineProperty(navigator, 'storage', {
    configurable: true,
    value: {
      persisted: () => Promise.resolve(persisted),
      persist: () => {
        calls.persist++;
        persisted = grant;
        return Promise.resolve(grant);
      },
      estimate: () => Promise.resolve({ usage: 3 * 1024 * 1024, quota: 2 * 1024 * 1024 * 1024 }),
    },
  });
  return calls;
}

describe('StoragePanel', () => {
  it('shows refused persistence with the warning and the advice to export regularly', async () => {
    const calls = stubStorage(false);
    render(<StoragePanel />);
    expect(await screen.findByTestId('storage-persisted')).toHaveTextContent('not granted');
    expect(screen.getByTestId('storage-usage')).toHaveTextContent('3.0 MB');
    expect(screen.getByTestId('storage-quota')).toHaveTextContent('2.0 GB (0.15 % used)');
    expect(screen.getByTestId('storage-warning')).toHaveTextContent(/may delete this log.*Export the cruise regularly/);
    expect(calls.persist).toBe(1);
    // The user may ask again; the browser is asked a second time.
    await userEvent.click(screen.getByRole('button', { name: 'Ask the browser again' }));
    await waitFor(() => expect(calls.persist).toBe(2));
  });

  it('shows granted persistence without a warning', async () => {
    stubStorage(true);
    render(<StoragePanel />);
    await waitFor(() => expect(screen.getByTestId('storage-persisted')).toHaveTextContent(/^granted$/));
    expect(screen.queryByTestId('storage-warning')).toBeNull();
    expect(screen.getByText(/keeps this log until you delete it/)).toBeInTheDocument();
  });

  it('says when the browser has no Storage API, and still warns', async () => {
    render(<StoragePanel />);
    expect(await screen.findByTestId('storage-persisted')).toHaveTextContent('not offered by this browser');
    expect(screen.getByTestId('storage-warning')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Ask the browser again' })).toBeNull();
  });

  it('formats byte counts', () => {
    expect([formatBytes(512), formatBytes(1536), formatBytes(250 * 1024 * 1024), formatBytes(5 * 1024 ** 4)]).toEqual(['512 B', '1.5 KB', '250 MB', '5.0 TB']);
  });
});

describe('DatabaseStatus', () => {
  it('shows nothing while the database works, and a reload message when another tab upgrades it', async () => {
    render(<DatabaseStatus />);
    await getDb().open();
    expect(screen.queryByTestId('database-alert')).toBeNull();
    const seen: string[] = [];
    const off = onDatabaseEvent((e) => seen.push(e.type));
    const latest = SCHEMA_VERSIONS[SCHEMA_VERSIONS.length - 1];
    const other = new FloeDatabase(name, { versions: [...SCHEMA_VERSIONS, { version: (latest?.version ?? 0) + 1, note: 'test', stores: latest?.stores ?? {} }] });
    await other.open();
    other.close();
    off();
    expect(seen).toEqual(['versionchange']);
    expect(await screen.findByTestId('database-alert')).toHaveTextContent(/updated in another tab.*draft is kept/);
    expect(screen.getByRole('button', { name: 'Reload' })).toBeInTheDocument();
  });

  it('says at start when the browser offers no IndexedDB', async () => {
    selectDatabase(name, { indexedDB: null });
    render(<DatabaseStatus />);
    expect(await screen.findByTestId('database-alert')).toHaveTextContent(/does not let Floe Ledger store data/);
  });
});
