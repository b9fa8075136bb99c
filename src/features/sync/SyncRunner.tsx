// Starts the sync when a ship server is set and switched on and a cruise is active; stops it
// otherwise; wakes it when the log changes. Renders nothing.
import { useLiveQuery } from 'dexie-react-hooks';
import { useEffect, useState } from 'react';
import { cruiseChangeStamp, deviceId, getSetting } from '../../db';
import { nudgeSync, runSync } from './runtime';

export function SyncRunner() {
  const server = useLiveQuery(() => getSetting('syncServer'), []);
  const cruiseId = useLiveQuery(() => getSetting('activeCruiseId'), []);
  const [device, setDevice] = useState<string | null>(null);
  useEffect(() => {
    void deviceId()
      .then(setDevice)
      .catch(() => setDevice(null));
  }, []);
  useEffect(() => {
    runSync(server?.enabled && cruiseId && device ? { url: server.url, cruiseId, deviceId: device } : null);
  }, [server, cruiseId, device]);
  // A save (or an import) changes the stamp: send at once instead of at the next poll.
  const stamp = useLiveQuery(() => (cruiseId && server?.enabled ? cruiseChangeStamp(cruiseId) : null), [cruiseId, server?.enabled]);
  useEffect(() => {
    if (stamp) nudgeSync();
  }, [stamp]);
  return null;
}
