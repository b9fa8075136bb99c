// An observation as labelled lines, so versions can be shown side by side (history, conflicts)
// with the differing lines marked.
import { eggCodeText, deriveEggCode } from '../../domain/eggCode';
import type { Observation, Observer } from '../../domain/model';
import { deformationOf, snowOf } from '../../domain/iceTypes';
import { FLOE_SIZES, OPEN_WATER_LABELS, SNOW_COVER_LABELS, SNOW_WETNESS, STAGES } from '../../domain/nomenclature';
import { CATEGORY_LETTERS, type ObservationFields } from './formModel';
import { POSITION_SOURCE_LABELS } from './options';
import { showPosition } from './positionText';

export type Version = ObservationFields & Partial<Pick<Observation, 'revision' | 'savedAt' | 'savedBy' | 'deleted'>>;

const v = (x: number | string | undefined | null, unit = '') => (x === undefined || x === null || x === '' ? '' : `${x}${unit}`);

export function versionLines(o: Version, observers: readonly Observer[]): [string, string][] {
  const who = (id: string | undefined) => observers.find((p) => p.id === id)?.initials ?? id ?? '';
  const lines: [string, string][] = [
    ['Revision', v(o.revision)],
    ['Saved', o.savedAt ? `${o.savedAt.replace('T', ' ').slice(0, 16)} by ${who(o.savedBy)}` : 'not saved'],
    ['Deleted', o.deleted ? 'yes' : ''],
    ['Time, UTC', o.time.replace('T', ' ').replace('Z', '')],
    ['Position', o.position ? `${showPosition(o.position)} (${POSITION_SOURCE_LABELS[o.position.source]})` : ''],
    ['Observer', who(o.observerId)],
    ['Egg code', eggCodeText(deriveEggCode(o))],
    ['Total, tenths', v(o.totalConcentration)],
  ];
  for (let i = 0; i < 3; i++) {
    const c = o.categories[i];
    const l = CATEGORY_LETTERS[i] ?? String(i + 1);
    lines.push(
      [`${l}: concentration`, v(c?.partialConcentration)],
      [`${l}: stage`, c ? STAGES[c.stage].label : ''],
      [`${l}: floe size`, c?.floeSize ? FLOE_SIZES[c.floeSize].label : ''],
      [`${l}: thickness`, v(c?.thicknessCm, ' cm')],
    );
  }
  for (let i = 0; i < 3; i++) {
    const d = deformationOf(o, i);
    const l = CATEGORY_LETTERS[i] ?? String(i + 1);
    lines.push(
      [`${l}: ridged / rafted`, d && (d.ridgedTenths !== undefined || d.raftedTenths !== undefined) ? `${v(d.ridgedTenths)} / ${v(d.raftedTenths)}` : ''],
      [`${l}: sail height`, v(d?.sailHeightM, ' m')],
    );
  }
  for (let i = 0; i < 3; i++) {
    const s = snowOf(o, i);
    const l = CATEGORY_LETTERS[i] ?? String(i + 1);
    const parts = s
      ? [
          s.cover ? SNOW_COVER_LABELS[s.cover] : '',
          s.wetness ? SNOW_WETNESS[s.wetness].label.toLowerCase() : '',
          s.crust ? 'crust' : '',
          s.drifts ? 'drifts' : '',
          v(s.depthCm, ' cm'),
        ].filter((x) => x !== '')
      : [];
    lines.push([`${l}: snow`, parts.join(', ')]);
  }
  lines.push(
    ['Trace So', o.traceStage ? STAGES[o.traceStage].label : ''],
    ['Remaining Sd', o.remainingStage ? STAGES[o.remainingStage].label : ''],
    ['Open water', o.openWater ? `${OPEN_WATER_LABELS[o.openWater.kind]}${o.openWater.widthM !== undefined ? `, ${o.openWater.widthM} m` : ''}${o.openWater.orientationDeg !== undefined ? `, ${o.openWater.orientationDeg}°` : ''}` : ''],
    ['Melt ponds', o.meltPonds ? `${o.meltPonds.coverTenths}/10${o.meltPonds.state ? `, ${o.meltPonds.state}` : ''}` : ''],
    ['Bergs / bits / growlers', o.icebergs ? `${o.icebergs.icebergs} / ${o.icebergs.bergyBits} / ${o.icebergs.growlers}` : ''],
    ['Air / water, °C', o.weather && (o.weather.airTempC !== undefined || o.weather.waterTempC !== undefined) ? `${v(o.weather.airTempC)} / ${v(o.weather.waterTempC)}` : ''],
    ['Wind', o.weather?.windSpeedKn !== undefined ? `${o.weather.windSpeedKn} kn${o.weather.windFromDeg !== undefined ? ` from ${o.weather.windFromDeg}°` : ''}` : ''],
    ['Visibility', v(o.weather?.visibilityKm, ' km')],
    ['Cloud', v(o.weather?.cloudOktas, ' oktas')],
    ['Notes', o.notes],
    ['Photos', o.photoIds.length > 0 ? String(o.photoIds.length) : ''],
    ['Warning notes', (o.reviews ?? []).map((r) => `${r.code}: ${r.comment}`).join('; ')],
  );
  return lines;
}

/** Lines of several versions as a table: label, one value per version, and whether they differ. */
export function compareVersions(versions: readonly Version[], observers: readonly Observer[]) {
  const all = versions.map((x) => versionLines(x, observers));
  const labels = all[0]?.map(([l]) => l) ?? [];
  return labels
    .map((label, row) => {
      const values = all.map((lines) => lines[row]?.[1] ?? '');
      return { label, values, differs: values.some((x) => x !== values[0]) };
    })
    .filter((r) => r.values.some((x) => x !== ''));
}
