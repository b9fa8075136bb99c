// Cruise setup: the vessel, its ice class (for POLARIS), the observers, the observation
// interval and the time zone shown beside UTC. Several cruises can be kept; one is active.
import { useId, useState, type FormEvent } from 'react';
import { createCruise, FloeDbError, setActiveCruise, updateCruise } from '../../db';
import { VESSEL_ICE_CLASSES, type Cruise, type Observer, type VesselIceClass } from '../../domain/model';
import { VESSEL_ICE_CLASS_LABELS } from '../../domain/polaris';
import { useActiveCruise, useCruises } from '../log/logData';
import { isKnownTimeZone } from '../log/useNow';
import '../log/log.css';

interface ObserverRow {
  id: string;
  name: string;
  initials: string;
}

interface CruiseFormValues {
  name: string;
  vesselName: string;
  iceClass: VesselIceClass;
  intervalMinutes: string;
  displayTimeZone: string;
  maxSpeedKn: string;
  observers: ObserverRow[];
}

function browserZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}

function valuesOf(c: Cruise | null): CruiseFormValues {
  if (!c) {
    return {
      name: '', vesselName: '', iceClass: 'none', intervalMinutes: '60', displayTimeZone: browserZone(), maxSpeedKn: '20',
      observers: [{ id: crypto.randomUUID(), name: '', initials: '' }],
    };
  }
  return {
    name: c.name, vesselName: c.vesselName, iceClass: c.iceClass, intervalMinutes: String(c.intervalMinutes),
    displayTimeZone: c.displayTimeZone, maxSpeedKn: String(c.maxSpeedKn), observers: c.observers.map((o) => ({ ...o })),
  };
}

export type CruiseFormErrors = Partial<Record<'name' | 'vesselName' | 'intervalMinutes' | 'displayTimeZone' | 'maxSpeedKn' | 'observers', string>>;

/** Checks the setup form; every message names the field. */
export function checkCruiseForm(v: CruiseFormValues): { errors: CruiseFormErrors; observers: Observer[] } {
  const errors: CruiseFormErrors = {};
  if (v.name.trim() === '') errors.name = 'Cruise name: give the cruise a name (e.g. its expedition code).';
  if (v.vesselName.trim() === '') errors.vesselName = 'Vessel: give the ship\'s name.';
  const interval = Number(v.intervalMinutes);
  if (!Number.isInteger(interval) || interval < 1 || interval > 1440) errors.intervalMinutes = `Interval: "${v.intervalMinutes}" must be whole minutes between 1 and 1440.`;
  if (!isKnownTimeZone(v.displayTimeZone.trim())) errors.displayTimeZone = `Time zone: "${v.displayTimeZone}" is not a time zone this browser knows (e.g. Europe/Oslo, UTC).`;
  const speed = Number(v.maxSpeedKn);
  if (!Number.isFinite(speed) || speed <= 0 || speed > 60) errors.maxSpeedKn = `Speed limit: "${v.maxSpeedKn}" must be a speed in knots above 0 and at most 60.`;
  const filled = v.observers.filter((o) => o.name.trim() !== '' || o.initials.trim() !== '');
  const observers: Observer[] = filled.map((o) => ({ id: o.id, name: o.name.trim(), initials: o.initials.trim().toUpperCase() }));
  const problems: string[] = [];
  if (observers.length === 0) problems.push('add at least one observer');
  observers.forEach((o, i) => {
    if (o.name === '') problems.push(`observer ${i + 1} has no name`);
    if (!/^[A-Z\u00C0-\u024F]{2,3}$/.test(o.initials)) problems.push(`observer ${i + 1} needs two or three letters as initials`);
  });
  const seen = new Set<string>();
  for (const o of observers) {
    if (seen.has(o.initials)) problems.push(`the initials ${o.initials} are used twice`);
    seen.add(o.initials);
  }
  if (problems.length > 0) errors.observers = `Observers: ${problems.join('; ')}.`;
  return { errors, observers };
}

interface EditorProps {
  /** The cruise to edit, or null for a new one. */
  cruise: Cruise | null;
  /** Make a new cruise the active one once saved. */
  makeActive?: boolean;
  onDone: (saved: Cruise | null) => void;
}

export function CruiseEditor({ cruise, makeActive = false, onDone }: EditorProps) {
  const uid = useId();
  const [v, setV] = useState<CruiseFormValues>(() => valuesOf(cruise));
  const [errors, setErrors] = useState<CruiseFormErrors>({});
  const [failure, setFailure] = useState<string | null>(null);
  const zones = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  const set = <K extends keyof CruiseFormValues>(k: K, value: CruiseFormValues[K]) => setV((old) => ({ ...old, [k]: value }));
  const setObserver = (i: number, patch: Partial<ObserverRow>) =>
    setV((old) => ({ ...old, observers: old.observers.map((o, j) => (j === i ? { ...o, ...patch } : o)) }));

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const checked = checkCruiseForm(v);
    setErrors(checked.errors);
    if (Object.keys(checked.errors).length > 0) return;
    const fields = {
      name: v.name.trim(), vesselName: v.vesselName.trim(), iceClass: v.iceClass, intervalMinutes: Number(v.intervalMinutes),
      displayTimeZone: v.displayTimeZone.trim(), maxSpeedKn: Number(v.maxSpeedKn), observers: checked.observers,
    };
    try {
      const saved = cruise ? await updateCruise(cruise.id, fields) : await createCruise(fields);
      if (!cruise && makeActive) await setActiveCruise(saved.id);
      setFailure(null);
      onDone(saved);
    } catch (err) {
      setFailure(err instanceof FloeDbError || err instanceof Error ? err.message : String(err));
    }
  };

  const err = (k: keyof CruiseFormErrors) =>
    errors[k] ? (
      <p className="finding finding-error" id={`${uid}-${k}-err`}>
        {errors[k]}
      </p>
    ) : null;
  const aria = (k: keyof CruiseFormErrors) => (errors[k] ? { 'aria-invalid': true as const, 'aria-describedby': `${uid}-${k}-err` } : {});

  return (
    <form className="cruise-editor" onSubmit={(e) => void submit(e)} noValidate aria-label={cruise ? `Edit cruise ${cruise.name}` : 'New cruise'}>
      <h3>{cruise ? `Edit ${cruise.name}` : 'New cruise'}</h3>
      <div className="field-row">
        <div className="field">
          <label htmlFor={`${uid}-name`}>Cruise name</label>
          <input id={`${uid}-name`} value={v.name} onChange={(e) => set('name', e.currentTarget.value)} {...aria('name')} />
          {err('name')}
        </div>
        <div className="field">
          <label htmlFor={`${uid}-vessel`}>Vessel</label>
          <input id={`${uid}-vessel`} value={v.vesselName} onChange={(e) => set('vesselName', e.currentTarget.value)} {...aria('vesselName')} />
          {err('vesselName')}
        </div>
        <div className="field">
          <label htmlFor={`${uid}-class`}>Vessel ice class (POLARIS)</label>
          <select id={`${uid}-class`} value={v.iceClass} onChange={(e) => set('iceClass', e.currentTarget.value as VesselIceClass)}>
            {VESSEL_ICE_CLASSES.map((c) => (
              <option key={c} value={c}>
                {VESSEL_ICE_CLASS_LABELS[c]}
              </option>
            ))}
          </select>
        </div>
      </div>
      <div className="field-row">
        <div className="field">
          <label htmlFor={`${uid}-interval`}>Observation interval, minutes</label>
          <input id={`${uid}-interval`} inputMode="numeric" value={v.intervalMinutes} onChange={(e) => set('intervalMinutes', e.currentTarget.value)} {...aria('intervalMinutes')} />
          {err('intervalMinutes')}
        </div>
        <div className="field">
          <label htmlFor={`${uid}-zone`}>Time zone shown beside UTC</label>
          <input id={`${uid}-zone`} list={`${uid}-zones`} value={v.displayTimeZone} onChange={(e) => set('displayTimeZone', e.currentTarget.value)} {...aria('displayTimeZone')} />
          <datalist id={`${uid}-zones`}>
            {zones.map((z) => (
              <option key={z} value={z} />
            ))}
          </datalist>
          {err('displayTimeZone')}
        </div>
        <div className="field">
          <label htmlFor={`${uid}-speed`}>Highest plausible ship speed, kn</label>
          <input id={`${uid}-speed`} inputMode="decimal" value={v.maxSpeedKn} onChange={(e) => set('maxSpeedKn', e.currentTarget.value)} {...aria('maxSpeedKn')} />
          {err('maxSpeedKn')}
        </div>
      </div>
      <fieldset className="observers-editor">
        <legend>Observers</legend>
        {v.observers.map((o, i) => (
          <div className="field-row" key={o.id}>
            <div className="field">
              <label htmlFor={`${uid}-obs-${i}-name`}>Observer {i + 1} name</label>
              <input id={`${uid}-obs-${i}-name`} value={o.name} onChange={(e) => setObserver(i, { name: e.currentTarget.value })} />
            </div>
            <div className="field narrow">
              <label htmlFor={`${uid}-obs-${i}-initials`}>Initials</label>
              <input id={`${uid}-obs-${i}-initials`} maxLength={3} value={o.initials} onChange={(e) => setObserver(i, { initials: e.currentTarget.value })} />
            </div>
            <button
              type="button"
              className="button small"
              onClick={() => setV((old) => ({ ...old, observers: old.observers.filter((_, j) => j !== i) }))}
              aria-label={`Remove observer ${i + 1}${o.name ? ` (${o.name})` : ''}`}
            >
              Remove
            </button>
          </div>
        ))}
        <button type="button" className="button" onClick={() => setV((old) => ({ ...old, observers: [...old.observers, { id: crypto.randomUUID(), name: '', initials: '' }] }))}>
          Add an observer
        </button>
        {err('observers')}
      </fieldset>
      <div className="inline">
        <button type="submit" className="button primary">
          {cruise ? 'Save the cruise' : 'Create the cruise'}
        </button>
        <button type="button" className="button" onClick={() => onDone(null)}>
          Cancel
        </button>
      </div>
      {failure && (
        <p className="finding finding-error" role="alert">
          {failure}
        </p>
      )}
    </form>
  );
}

/** The settings section: every cruise, which one is active, and the editor. */
export function CruiseSetup() {
  const cruises = useCruises();
  const active = useActiveCruise();
  const [editing, setEditing] = useState<Cruise | 'new' | null>(null);
  const [message, setMessage] = useState<string | null>(null);

  return (
    <section className="cruise-setup" aria-labelledby="cruise-setup-title">
      <h3 id="cruise-setup-title">Cruises</h3>
      {cruises && cruises.length === 0 && <p>No cruise yet.</p>}
      {cruises && cruises.length > 0 && (
        <table className="cruise-table">
          <thead>
            <tr>
              <th scope="col">Cruise</th>
              <th scope="col">Vessel</th>
              <th scope="col">Ice class</th>
              <th scope="col">Interval</th>
              <th scope="col">Observers</th>
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {cruises.map((c) => {
              const isActive = active?.id === c.id;
              return (
                <tr key={c.id} aria-current={isActive ? 'true' : undefined}>
                  <td>
                    {c.name} {isActive && <strong className="badge">active</strong>}
                  </td>
                  <td>{c.vesselName}</td>
                  <td>{VESSEL_ICE_CLASS_LABELS[c.iceClass]}</td>
                  <td>{c.intervalMinutes} min</td>
                  <td>{c.observers.map((o) => o.initials).join(', ')}</td>
                  <td className="inline">
                    {!isActive && (
                      <button
                        type="button"
                        className="button small"
                        onClick={() => {
                          void setActiveCruise(c.id).then(
                            () => setMessage(`${c.name} is now the active cruise.`),
                            (e: unknown) => setMessage(e instanceof Error ? e.message : String(e)),
                          );
                        }}
                      >
                        Make active
                      </button>
                    )}
                    <button type="button" className="button small" onClick={() => setEditing(c)} aria-label={`Edit ${c.name}`}>
                      Edit
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      {message && <p role="status">{message}</p>}
      {editing === null && (
        <button type="button" className="button" onClick={() => setEditing('new')}>
          New cruise
        </button>
      )}
      {editing !== null && (
        <CruiseEditor
          key={editing === 'new' ? 'new' : editing.id}
          cruise={editing === 'new' ? null : editing}
          makeActive={editing === 'new' && !active}
          onDone={(saved) => {
            setEditing(null);
            if (saved) setMessage(`Saved ${saved.name}.`);
          }}
        />
      )}
    </section>
  );
}
