// The egg code as the observer sees it, rendered: a dotted stage symbol ("7." old ice, "1."
// medium first-year: WMO-No. 259 stage codes) never runs into the next symbol, so "7. 1. 5" is
// never read as "7.1.5" or "1.75". The text form keeps two spaces after a dot and is shown with
// white space kept; the drawn egg places the dot as its own shape beside its digit.
import { render, screen } from '@testing-library/react';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { deriveEggCode } from '../../../src/domain/eggCode';
import type { Cruise, Observation } from '../../../src/domain/model';
import { EggCodeView } from '../../../src/features/log/EggCodeView';
import { ObservationList } from '../../../src/features/log/ObservationList';
import { SidePanel } from '../../../src/features/log/SidePanel';
import { ObservationDetails } from '../../../src/features/map/ObservationDetails';

const heightSpy = vi.spyOn(HTMLElement.prototype, 'clientHeight', 'get');
const widthSpy = vi.spyOn(HTMLElement.prototype, 'clientWidth', 'get');
beforeAll(() => {
  heightSpy.mockReturnValue(420);
  widthSpy.mockReturnValue(900);
});
afterAll(() => {
  heightSpy.mockRestore();
  widthSpy.mockRestore();
});

// Invented test data: our own vessel and observer.
const cruise: Cruise = {
  id: 'c1', name: 'TEST-12', vesselName: 'RV Frostwren', iceClass: 'PC5', intervalMinutes: 60,
  observers: [{ id: 'mh', name: 'Maren Holtvik', initials: 'MH' }], displayTimeZone: 'UTC', maxSpeedKn: 20,
  createdAt: '2026-03-01T00:00:00Z', updatedAt: '2026-03-01T00:00:00Z',
};
const observation: Observation = {
  id: 'o1', cruiseId: 'c1', time: '2026-03-10T06:00:00Z', position: { lat: 81.2, lon: 12.5, source: 'manual' }, observerId: 'mh',
  totalConcentration: 9,
  categories: [
    { partialConcentration: 4, stage: 'old', floeSize: 'big-floe' },
    { partialConcentration: 3, stage: 'medium-first-year', floeSize: 'medium-floe' },
    { partialConcentration: 2, stage: 'grey-white', floeSize: 'small-floe' },
  ],
  notes: '', photoIds: [], revision: 1, savedAt: '2026-03-10T06:00:00Z', savedBy: 'mh', deviceId: 'd', deleted: false,
};
// WMO-No. 259 stage codes: old ice 7., medium first-year 1., grey-white 5; forms: big floe 5,
// medium floe 4, small floe 3.
const TEXT = '9 4 3 2 / - 7.  1.  5 - / 5 4 3';

/** The run of a dotted symbol and what follows it must hold two spaces: never ".7" or ". 7". */
function expectSpaced(text: string | null | undefined): void {
  expect(text).toContain('7.  1.  5');
  expect(text).not.toMatch(/\. ?\S/);
}

describe('egg code text, rendered', () => {
  it('the list row shows the text form with white space kept', () => {
    render(<ObservationList cruise={cruise} observations={[observation]} onEdit={() => undefined} onHistory={() => undefined} />);
    const cell = screen.getByTestId('observation-row').querySelector('.cell-egg') as HTMLElement;
    expect(cell.textContent).toBe(TEXT);
    expectSpaced(cell.textContent);
    // jsdom applies no stylesheet: the class is the one log.css gives `white-space: pre`.
    expect(cell).toHaveClass('cell-egg');
  });

  it('the form side panel and the map details show the same spaced text', () => {
    const { unmount } = render(<SidePanel cruise={cruise} observation={observation} />);
    const side = screen.getByTestId('egg-text');
    expect(side.textContent).toBe(TEXT);
    expect(side).toHaveClass('egg-text');
    unmount();
    render(<ObservationDetails observation={observation} observers={cruise.observers} onClose={() => undefined} />);
    const dd = document.querySelector('.egg-line') as HTMLElement;
    expect(dd.textContent).toBe(TEXT);

  });

  it('the drawn egg writes each stage digit alone, with its dot as a shape just right of it', () => {
    const { container } = render(<EggCodeView code={deriveEggCode(observation)} />);
    const sa = container.querySelector('text[data-field="sa"]');
    const sb = container.querySelector('text[data-field="sb"]');
    const sc = container.querySelector('text[data-field="sc"]');
    expect([sa?.textContent, sb?.textContent, sc?.textContent]).toEqual(['7', '1', '5']);
    const dotA = container.querySelector('circle[data-dot-of="sa"]');
    const dotB = container.querySelector('circle[data-dot-of="sb"]');
    expect(dotA).not.toBeNull();
    expect(dotB).not.toBeNull();
    expect(container.querySelector('circle[data-dot-of="sc"]')).toBeNull();
    const x = (el: Element | null, a: string) => Number(el?.getAttribute(a));
    const size = Number(sa?.getAttribute('font-size'));
    // The dot sits past the digit's centre, well before the next symbol: the air after the dot
    // (to the next digit's left edge, half a digit of about 0.3 em from its centre; from memory)
    // is at least 0.6 em with three stage columns.
    expect(x(dotA, 'cx')).toBeGreaterThan(x(sa, 'x'));
    expect((x(sb, 'x') - 0.3 * size - (x(dotA, 'cx') + x(dotA, 'r'))) / size).toBeGreaterThanOrEqual(0.6);
    expect((x(sc, 'x') - 0.3 * size - (x(dotB, 'cx') + x(dotB, 'r'))) / size).toBeGreaterThanOrEqual(0.6);
    expect(container.querySelector('svg')?.getAttribute('aria-label')).toBe(`Egg code ${TEXT}`);
  });
});
