import { CruiseEnd } from './CruiseEnd';
import { CruiseSetup } from './CruiseSetup';
import { StoragePanel } from './StoragePanel';
import { SyncPanel } from '../sync/SyncPanel';

export function SettingsScreen() {
  return (
    <section className="screen" aria-labelledby="settings-title">
      <h2 id="settings-title">Settings</h2>
      <p>Settings: cruise, vessel, observers, storage, ship server and display.</p>
      <CruiseSetup />
      <CruiseEnd />
      <StoragePanel />
      <SyncPanel />
    </section>
  );
}
