// The Exchange screen: export the log, import and merge logs from other laptops, settle
// conflicting copies, and keep an automatic backup.
import { useLiveQuery } from 'dexie-react-hooks';
import { useState } from 'react';
import { getSetting, listCruises } from '../../db';
import { BackupPanel } from './BackupPanel';
import { ConflictsPanel } from './ConflictsPanel';
import { ExportPanel } from './ExportPanel';
import { IceInfoPanel } from './IceInfoPanel';
import { ImportPanel } from './ImportPanel';
import './exchange.css';

export function ExchangeScreen() {
  const cruises = useLiveQuery(() => listCruises(), []);
  const activeId = useLiveQuery(() => getSetting('activeCruiseId'), []);
  const [chosen, setChosen] = useState<string | null>(null);
  const cruiseId = chosen ?? activeId ?? cruises?.[0]?.id ?? null;
  const cruise = cruises?.find((c) => c.id === cruiseId) ?? null;

  return (
    <section className="screen exchange-screen" aria-labelledby="exchange-title">
      <h2 id="exchange-title">Exchange</h2>
      {cruises && cruises.length > 1 && (
        <label className="cruise-choice">
          Cruise{' '}
          <select value={cruiseId ?? ''} onChange={(e) => setChosen(e.target.value)} aria-label="Cruise to export">
            {cruises.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} ({c.vesselName})
              </option>
            ))}
          </select>
        </label>
      )}
      {cruise && cruises?.length === 1 && (
        <p>
          Cruise <strong>{cruise.name}</strong>, {cruise.vesselName}
        </p>
      )}
      <div className="exchange-grid">
        <ExportPanel cruiseId={cruiseId} />
        <ImportPanel onImported={(id) => setChosen(id)} />
        <BackupPanel cruiseId={activeId ?? cruiseId} cruiseName={cruises?.find((c) => c.id === (activeId ?? cruiseId))?.name ?? null} />
      </div>
      <IceInfoPanel />
      <ConflictsPanel cruiseId={cruiseId} />
    </section>
  );
}
