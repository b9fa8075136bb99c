import { CruiseEnd } from './CruiseEnd';
import { CruiseSetup } from './CruiseSetup';
import { StoragePanel } from './StoragePanel';

export function SettingsScreen() {
  return (
    <section className="screen" aria-labelledby="settings-title">
      <h2 id="settings-title">Settings</h2>
      <p>Settings: cruise, vessel, observers, storage and display.</p>
      <CruiseSetup />
      <CruiseEnd />
      <StoragePanel />
    </section>
  );
}
