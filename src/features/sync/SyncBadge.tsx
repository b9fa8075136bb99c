// The header's sync state at a glance: synced, N waiting to send, receiving (with progress),
// offline since (and why), refused (and why). Nothing when sync is off.
import type { SyncStatus } from '../../sync/engine';
import { useSyncStatus } from './runtime';
import './sync.css';

const time = (iso: string) => `${iso.slice(11, 16)} UTC`;

export function syncText(s: SyncStatus): { text: string; tone: 'ok' | 'busy' | 'trouble'; detail: string | null } {
  const waiting = s.waiting > 0 ? `${s.waiting} waiting to send` : null;
  switch (s.phase) {
    case 'offline':
      return { text: `Ship server offline since ${time(s.troubleSince ?? new Date().toISOString())}${waiting ? `, ${waiting}` : ''}`, tone: 'trouble', detail: s.reason };
    case 'refused':
      return { text: `Ship server refused${waiting ? `, ${waiting}` : ''}`, tone: 'trouble', detail: s.reason };
    case 'receiving':
      return { text: s.progress ? `Receiving from the ship server: ${s.progress.received}${s.progress.total !== null ? ` of ${s.progress.total}` : ''} documents` : 'Receiving from the ship server', tone: 'busy', detail: null };
    case 'sending':
      return { text: waiting ? `Ship server: ${waiting}` : 'Sending to the ship server', tone: 'busy', detail: null };
    case 'connecting':
      return { text: 'Connecting to the ship server', tone: 'busy', detail: null };
    case 'stopped':
      return { text: 'Ship server sync stopped', tone: 'busy', detail: null };
    case 'synced':
      return { text: waiting ? `Ship server: ${waiting}` : 'Synced with the ship server', tone: waiting ? 'busy' : 'ok', detail: null };
  }
}

export function SyncBadge() {
  const s = useSyncStatus();
  if (!s) return null;
  const { text, tone, detail } = syncText(s);
  const refusedDocs = s.refusedDocs.length;
  return (
    <div className={`sync-badge sync-${tone}`} role="status" aria-live="polite" data-testid="sync-badge" title={detail ?? undefined}>
      <span>{text}</span>
      {detail && <span className="sync-detail">: {detail}</span>}
      {refusedDocs > 0 && <span className="sync-detail"> ({refusedDocs} document{refusedDocs > 1 ? 's' : ''} from the server refused: see Settings)</span>}
    </div>
  );
}
