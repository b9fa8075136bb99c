// The ship's GPS over Web Serial: baud rate, connect and disconnect, fix quality and age,
// good and bad sentence counts, and how often the position goes into the track.
import { BAUD_RATES } from '../../gps/webSerial';
import { useGpsStore } from '../../state/gps';
import { connectGps, disconnectGps } from './gpsConnection';
import { showPosition } from './positionText';
import { useNow } from './useNow';

/** GGA fix quality indicator (NMEA 0183). */
const QUALITY: Record<number, string> = {
  0: 'no fix', 1: 'GPS fix', 2: 'differential GPS', 3: 'PPS fix', 4: 'RTK fixed', 5: 'RTK float', 6: 'estimated (dead reckoning)', 7: 'manual input', 8: 'simulation',
};

const TRACK_INTERVALS = [10, 30, 60, 120, 300] as const;

export function fixAgeS(fixAtMs: number, ageMsThen: number, nowMs: number): number {
  return Math.max(0, Math.round((nowMs - fixAtMs + ageMsThen) / 1000));
}

export function GpsPanel({ cruiseId }: { cruiseId: string }) {
  const s = useGpsStore();
  const now = useNow(1000);
  const connected = s.status === 'connected' || s.status === 'connecting';
  const age = s.fix ? fixAgeS(s.fixAtMs, s.fix.ageMs, now.getTime()) : null;
  const stale = age !== null && age > 30;

  return (
    <section className="gps-panel" aria-labelledby="gps-title">
      <h3 id="gps-title">Ship GPS</h3>
      <div className="field-row">
        <div className="field">
          <label htmlFor="gps-baud">Baud rate</label>
          <select id="gps-baud" value={s.baudRate} disabled={connected} onChange={(e) => s.patch({ baudRate: Number(e.currentTarget.value) })}>
            {BAUD_RATES.map((b) => (
              <option key={b} value={b}>
                {b}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor="gps-track">Track point every</label>
          <select id="gps-track" value={s.trackIntervalS} onChange={(e) => s.patch({ trackIntervalS: Number(e.currentTarget.value) })}>
            {TRACK_INTERVALS.map((t) => (
              <option key={t} value={t}>
                {t < 60 ? `${t} s` : `${t / 60} min`}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <span className="label-like">Connection</span>
          {connected ? (
            <button type="button" className="button" onClick={() => void disconnectGps()}>
              Disconnect
            </button>
          ) : (
            <button type="button" className="button primary" onClick={() => void connectGps(cruiseId)}>
              Connect the GPS
            </button>
          )}
        </div>
      </div>
      <dl className="gps-status" data-testid="gps-status" data-status={s.status}>
        <div>
          <dt>Status</dt>
          <dd>{s.status}</dd>
        </div>
        <div>
          <dt>Fix</dt>
          <dd data-testid="gps-fix">{s.fix ? showPosition(s.fix) : 'none'}</dd>
        </div>
        <div>
          <dt>Quality</dt>
          <dd>
            {s.fix?.fixQuality !== null && s.fix?.fixQuality !== undefined ? (QUALITY[s.fix.fixQuality] ?? `code ${s.fix.fixQuality}`) : s.fix ? 'from RMC' : '—'}
            {s.fix?.satellites != null && `, ${s.fix.satellites} satellites`}
            {s.fix?.hdop != null && `, HDOP ${s.fix.hdop}`}
          </dd>
        </div>
        <div>
          <dt>Age</dt>
          <dd className={stale ? 'finding-warning' : undefined} data-testid="gps-age">
            {age === null ? '—' : `${age} s${stale ? ' (stale)' : ''}`}
          </dd>
        </div>
        <div>
          <dt>Sentences</dt>
          <dd data-testid="gps-counts">
            {s.goodSentences} good, {s.badSentences} bad
          </dd>
        </div>
        {s.fix?.sogKn != null && (
          <div>
            <dt>Speed, course</dt>
            <dd>
              {s.fix.sogKn.toFixed(1)} kn{s.fix.cogDeg != null && `, ${s.fix.cogDeg.toFixed(0)}°`}
              {s.fix.headingDeg != null && `, heading ${s.fix.headingDeg.toFixed(0)}°`}
            </dd>
          </div>
        )}
        <div>
          <dt>Last track point</dt>
          <dd>{s.lastTrackWrite ? `${s.lastTrackWrite.slice(11, 19)} UTC` : '—'}</dd>
        </div>
      </dl>
      {s.lastBad && <p className="muted small" data-testid="gps-last-bad">Last bad sentence skipped: {s.lastBad}</p>}
      {s.message && <p className={s.status === 'error' ? 'finding finding-error' : 'muted'} role="status">{s.message}</p>}
    </section>
  );
}
