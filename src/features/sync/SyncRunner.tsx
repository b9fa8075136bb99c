// Starts the sync when a ship server is set and switched on and a cruise is active; stops it
// otherwise; wakes it when the log changes or the network comes back. Renders nothing.
import { useLiveQuery } from 'dexie-react-hooks';
import { useEffect, useState } from 'react';
import { cruiseChangeStamp, deviceId, getCruise, getSetting, setActiveCruise } from '../../db';
import { nudgeSync, runSync } from './runtime';

export function SyncRunner() {
  const server = useLiveQuery(() => getSetting('syncServer'), []);
  const activeId = useLiveQuery(() => getSetting('activeCruiseId'), []);
  // A laptop joining mid-cruise has no cruise yet: it receives the one named in the settings,
  // and makes it active once its record has arrived.
  const joinId = !activeId && server?.enabled ? (server.joinCruiseId ?? null) : null;
  const joined = useLiveQuery(async () => (joinId ? ((await getCruise(joinId)) ?? null) : null), [joinId]);
  useEffect(() => {
    if (joined && !activeId) void setActiveCruise(joined.id).catch(() => undefined);
  }, [joined, activeId]);
  const cruiseId = activeId ?? joinId;
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
  // The link is back: send what waited now rather than at the end of a backoff of up to a minute.
  useEffect(() => {
    const online = () => nudgeSync();
    window.addEventListener('online', online);
    return () => window.removeEventListener('online', online);
  }, []);
  return null;
}
