// The one ship-GPS connection of this tab, kept outside React so it survives switching screens.
// It feeds the GPS store (fix, counts, status) and writes the position to the cruise's track
// every `trackIntervalS` seconds while connected.
import { addTrackPoints } from '../../db';
import { describeNmeaError } from '../../gps/nmea';
import { TrackRecorder } from '../../gps/trackPosition';
import { connectSerialGps, isWebSerialAvailable, requestSerialPort, type SerialGpsConnection, type SerialPortLike } from '../../gps/webSerial';
import { useGpsStore } from '../../state/gps';

let connection: SerialGpsConnection | null = null;
let recorder: TrackRecorder | null = null;
let recorderInterval = 0;

export function webSerialAvailable(): boolean {
  return isWebSerialAvailable();
}

/** Opens the chosen (or given) port and starts reading; the message says what went wrong. */
export async function connectGps(cruiseId: string, port?: SerialPortLike): Promise<void> {
  const store = useGpsStore.getState();
  if (connection) await disconnectGps();
  if (!port && !isWebSerialAvailable()) {
    store.patch({ status: 'error', message: 'This browser has no Web Serial: use Chromium or Edge on the bridge laptop, or take positions from geolocation or the track.' });
    return;
  }
  store.patch({ status: 'connecting', message: null });
  let chosen: SerialPortLike | null = port ?? null;
  try {
    chosen ??= await requestSerialPort();
  } catch (err) {
    store.patch({ status: 'error', message: `No serial port: ${err instanceof Error ? err.message : String(err)}` });
    return;
  }
  if (!chosen) {
    store.patch({ status: 'disconnected', message: 'No port chosen.' });
    return;
  }
  recorder = null;
  try {
    connection = await connectSerialGps(chosen, {
      baudRate: useGpsStore.getState().baudRate,
      onFix: (fix) => {
        const nowMs = Date.now();
        useGpsStore.getState().patch({ fix, fixAtMs: nowMs });
        const intervalMs = useGpsStore.getState().trackIntervalS * 1000;
        // A new interval chosen while connected takes effect at once.
        if (!recorder || recorderInterval !== intervalMs) {
          recorder = new TrackRecorder({ cruiseId, source: 'gps-serial', intervalMs });
          recorderInterval = intervalMs;
        }
        const point = recorder.offer(fix, nowMs);
        if (point) {
          void addTrackPoints([point]).then(
            () => useGpsStore.getState().patch({ lastTrackWrite: point.time }),
            (err: unknown) => useGpsStore.getState().patch({ message: `Track point not stored: ${err instanceof Error ? err.message : String(err)}` }),
          );
        }
      },
      onLine: (_line, result) => {
        const c = connection?.tracker.counts;
        const patch: Parameters<ReturnType<typeof useGpsStore.getState>['patch']>[0] = {};
        if (c) {
          patch.goodSentences = c.good;
          patch.badSentences = c.bad;
        }
        if (!result.ok && result.error.kind !== 'unsupported') patch.lastBad = describeNmeaError(result.error);
        useGpsStore.getState().patch(patch);
      },
      onStatus: (status, detail) => {
        if (status === 'reading') useGpsStore.getState().patch({ status: 'connected', ...(detail ? { message: detail } : {}) });
        else if (status === 'disconnected' || status === 'closed') useGpsStore.getState().patch({ status: 'disconnected', message: detail ?? null });
        else if (status === 'error') useGpsStore.getState().patch({ status: 'error', message: detail ?? 'The serial port failed.' });
      },
    });
    // The counts of a new connection start from zero.
    useGpsStore.getState().patch({ goodSentences: 0, badSentences: 0, lastBad: null });
  } catch (err) {
    connection = null;
    useGpsStore.getState().patch({ status: 'error', message: err instanceof Error ? err.message : String(err) });
  }
}

export async function disconnectGps(): Promise<void> {
  const c = connection;
  connection = null;
  if (c) await c.close();
  useGpsStore.getState().patch({ status: 'disconnected' });
}
