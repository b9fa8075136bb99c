// "Load the demo cruise": the invented RV Frostwren scenario (src/domain/demo.ts) written into
// the store like any other cruise, then made active. Loading it twice only makes it active.
import { addTrackPoints, createCruise, getCruise, saveObservation, setActiveCruise } from '../../db';
import { makeDemoCruise } from '../../domain/demo';

export interface DemoLoadProgress {
  done: number;
  total: number;
  what: string;
}

export async function loadDemoCruise(onProgress?: (p: DemoLoadProgress) => void): Promise<{ cruiseId: string; observations: number; trackPoints: number; alreadyThere: boolean }> {
  const demo = makeDemoCruise();
  const { id, createdAt: _c, updatedAt: _u, ...rest } = demo.cruise;
  if (await getCruise(id)) {
    await setActiveCruise(id);
    return { cruiseId: id, observations: demo.observations.length, trackPoints: demo.track.length, alreadyThere: true };
  }
  // The demo cruise lies in the past: it ends an interval after its last observation, so its
  // watch never calls for an observation or counts missed hours today.
  const last = demo.observations.reduce((m, o) => Math.max(m, Date.parse(o.time)), 0);
  const endTime = new Date(last + demo.cruise.intervalMinutes * 60_000).toISOString().replace(/\.\d{3}Z$/, 'Z');
  await createCruise({ ...rest, id, endTime });
  const total = demo.observations.length;
  onProgress?.({ done: 0, total, what: 'observations' });
  let done = 0;
  for (const o of demo.observations) {
    const { revision: _r, savedAt: _s, deviceId: _d, deleted: _x, savedBy, ...input } = o;
    await saveObservation(input, { savedBy });
    done += 1;
    if (done % 10 === 0 || done === total) onProgress?.({ done, total, what: 'observations' });
  }
  await addTrackPoints(demo.track, {
    onProgress: (committed, all) => onProgress?.({ done: committed, total: all, what: 'track points' }),
  });
  await setActiveCruise(id);
  return { cruiseId: id, observations: total, trackPoints: demo.track.length, alreadyThere: false };
}
