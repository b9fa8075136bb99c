// Every observation of the cruise, newest first, virtualised so tens of thousands scroll as
// smoothly as ten: time, position (degrees and decimal minutes), total concentration, egg code,
// POLARIS RIO and findings; missed observation slots appear as their own flagged lines.
// Arrow keys move the selection (shared with the map), Enter edits, H shows the history.
import { useVirtualizer } from '@tanstack/react-virtual';
import { useEffect, useMemo, useRef, type KeyboardEvent } from 'react';
import { deriveEggCode, eggCodeText } from '../../domain/eggCode';
import type { Cruise, Finding, Observation } from '../../domain/model';
import { polarisForObservation } from '../../domain/polaris';
import { groupMissed, missedRunText, missedSlotsBetween, type MissedRun } from '../../domain/watch';
import { useSelection } from '../../state/selection';
import { cruiseFindings } from './findings';
import { showPosition } from './positionText';

export type ListRow =
  | { kind: 'observation'; observation: Observation; egg: string; rio: number | null; outcome: string | null; findings: Finding[] }
  | { kind: 'missed'; run: MissedRun };

/** The list's rows, newest first, with missed slots between observations as rows of their own. */
export function buildRows(cruise: Cruise, observations: readonly Observation[]): ListRow[] {
  // Same-minute entries: the one saved last is shown first.
  const key = (o: Observation) => `${o.time}|${o.savedAt}`;
  const asc = [...observations].sort((a, b) => (key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : 0));
  const rows: ListRow[] = [];
  const first = asc[0];
  const last = asc[asc.length - 1];
  const missed =
    first && last
      ? groupMissed(missedSlotsBetween(asc.map((o) => o.time), cruise.intervalMinutes, Date.parse(first.time), Date.parse(last.time)), cruise.intervalMinutes)
      : [];
  const findings = cruiseFindings(cruise, asc);
  let m = missed.length - 1;
  for (let i = asc.length - 1; i >= 0; i--) {
    const o = asc[i] as Observation;
    while (m >= 0 && (missed[m] as MissedRun).from > o.time) {
      rows.push({ kind: 'missed', run: missed[m] as MissedRun });
      m--;
    }
    const polaris = polarisForObservation(o, cruise.iceClass);
    rows.push({
      kind: 'observation',
      observation: o,
      egg: eggCodeText(deriveEggCode(o)),
      rio: polaris.ok ? polaris.value.rio : null,
      outcome: polaris.ok ? polaris.value.outcome : null,
      findings: (findings.get(o.id) ?? []).filter((f) => f.severity !== 'info'),
    });
  }
  return rows;
}

interface Props {
  cruise: Cruise;
  observations: readonly Observation[];
  onEdit: (o: Observation) => void;
  onHistory: (o: Observation) => void;
  /** Height of the scrolling area in px. */
  height?: number;
  /** With a ship server: the highest revision of each observation the server holds. */
  onServer?: ReadonlyMap<string, number> | null;
}

const ROW_HEIGHT = 52;

export function ObservationList({ cruise, observations, onEdit, onHistory, height = 420, onServer = null }: Props) {
  const rows = useMemo(() => buildRows(cruise, observations), [cruise, observations]);
  const selectedId = useSelection((s) => s.selectedId);
  const select = useSelection((s) => s.select);
  const scrollRef = useRef<HTMLDivElement>(null);
  // The virtualiser's functions change identity on every scroll by design; nothing here memoises them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 8,
    initialRect: { width: 800, height },
  });
  const observers = useMemo(() => new Map(cruise.observers.map((o) => [o.id, o.initials])), [cruise.observers]);
  const selectionSource = useSelection((s) => s.source);
  const selectedIndex = rows.findIndex((r) => r.kind === 'observation' && r.observation.id === selectedId);
  const count = observations.length;
  const selectedRow = rows[selectedIndex];
  const selected = selectedRow?.kind === 'observation' ? selectedRow.observation : null;

  // A selection made on the map scrolls the list to it.
  useEffect(() => {
    if (selectionSource === 'map' && selectedIndex >= 0) virtualizer.scrollToIndex(selectedIndex, { align: 'center' });
  }, [selectionSource, selectedIndex, virtualizer]);

  const move = (delta: number) => {
    let i = selectedIndex < 0 ? (delta > 0 ? -1 : rows.length) : selectedIndex;
    for (;;) {
      i += delta;
      const r = rows[i];
      if (!r) return;
      if (r.kind === 'observation') {
        select(r.observation.id, 'list');
        virtualizer.scrollToIndex(i, { align: 'auto' });
        return;
      }
    }
  };

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const r = rows[selectedIndex];
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      move(1);
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      move(-1);
    } else if (e.key === 'Home' || e.key === 'End') {
      e.preventDefault();
      const list = e.key === 'Home' ? rows : [...rows].reverse();
      const target = list.find((x) => x.kind === 'observation');
      if (target?.kind === 'observation') {
        select(target.observation.id, 'list');
        virtualizer.scrollToIndex(rows.indexOf(target));
      }
    } else if (e.key === 'Enter' && r?.kind === 'observation') {
      e.preventDefault();
      onEdit(r.observation);
    } else if (e.key.toLowerCase() === 'h' && r?.kind === 'observation') {
      e.preventDefault();
      onHistory(r.observation);
    }
  };

  return (
    <section className="observation-list" aria-labelledby="list-title">
      <h3 id="list-title">
        Observations <span className="muted">({count})</span>
      </h3>
      <div className="list-toolbar inline">
        <button type="button" className="button small" disabled={selected === null} onClick={() => selected && onEdit(selected)}>
          Edit the selected observation <kbd>Enter</kbd>
        </button>
        <button type="button" className="button small" disabled={selected === null} onClick={() => selected && onHistory(selected)}>
          Its history{selected && selected.revision > 1 ? ` (${selected.revision} revisions)` : ''} <kbd>H</kbd>
        </button>
      </div>
      <div className="list-header" aria-hidden="true">
        <span>Time, UTC</span>
        <span>Obs.</span>
        <span>Position</span>
        <span>Ct</span>
        <span>Egg code</span>
        <span>RIO</span>
        <span>Findings</span>
      </div>
      <div
        ref={scrollRef}
        className="list-scroll"
        style={{ height, overflowY: 'auto' }}
        tabIndex={0}
        role="listbox"
        aria-label={`Observations of ${cruise.name}, newest first. Arrow keys select, Enter edits, H shows the history.`}
        aria-activedescendant={selectedId ? `row-${selectedId}` : undefined}
        onKeyDown={onKeyDown}
        data-testid="observation-list"
      >
        {rows.length === 0 && <p className="muted list-empty">No observation yet in this cruise.</p>}
        <div style={{ height: virtualizer.getTotalSize(), position: 'relative' }}>
          {virtualizer.getVirtualItems().map((item) => {
            const r = rows[item.index];
            if (!r) return null;
            const style = { position: 'absolute' as const, top: 0, left: 0, right: 0, height: ROW_HEIGHT, transform: `translateY(${item.start}px)` };
            if (r.kind === 'missed') {
              return (
                <div key={`m-${r.run.from}`} className="list-row missed" style={style} role="option" aria-selected={false} data-testid="missed-row">
                  <span className="finding finding-warning">
                    Missed: {missedRunText(r.run)}
                  </span>
                </div>
              );
            }
            const o = r.observation;
            const errors = r.findings.filter((f) => f.severity === 'error').length;
            const warnings = r.findings.length - errors;
            const isSelected = o.id === selectedId;
            return (
              <div
                key={o.id}
                id={`row-${o.id}`}
                className={`list-row${isSelected ? ' selected' : ''}`}
                style={style}
                role="option"
                aria-selected={isSelected}
                onClick={() => select(o.id, 'list')}
                onDoubleClick={() => onEdit(o)}
                data-testid="observation-row"
              >
                <span className="cell-time">
                  {o.time.replace('T', ' ').slice(0, 16)}
                  {onServer && <ServerMark reached={(onServer.get(o.id) ?? 0) >= o.revision} />}
                </span>
                <span>{observers.get(o.observerId) ?? '?'}</span>
                <span className="cell-position">{showPosition(o.position)}</span>
                <span>{o.totalConcentration ?? 'X'}</span>
                <span className="cell-egg">{r.egg}</span>
                <span className={r.outcome ? `rio-${r.outcome}` : undefined}>{r.rio ?? '—'}</span>
                <span className="cell-findings" title={r.findings.map((f) => f.message).join('\n')}>
                  {errors > 0 && <span className="finding-error">{errors} error{errors > 1 ? 's' : ''}</span>}
                  {errors > 0 && warnings > 0 && ', '}
                  {warnings > 0 && <span className="finding-warning">{warnings} warning{warnings > 1 ? 's' : ''}</span>}
                  {r.findings.length === 0 && <span className="muted">—</span>}
                </span>
              </div>
            );
          })}
        </div>
      </div>
    </section>
  );
}

/** Whether this revision reached the ship server: a word, not only a colour or a symbol. */
function ServerMark({ reached }: { reached: boolean }) {
  return (
    <span className={`server-mark${reached ? ' reached' : ''}`} data-testid="server-mark" title={reached ? 'This revision is on the ship server' : 'Not on the ship server yet: waiting to send'}>
      {reached ? ' on server' : ' waiting'}
    </span>
  );
}
