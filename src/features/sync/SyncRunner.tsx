// Starts the sync when a ship server is set and switched on and a cruise is active; stops it
// otherwise. Renders nothing.
import { useLiveQuery } from 'dexie-react-hooks';
import { useEffect, useState } from 'react';
import { deviceId, getSetting } from '../../db';
import { runSync } from './runtime';

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
  return null;
}
