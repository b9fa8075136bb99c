import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Observation } from '../../../src/domain/model';
import { ObservationDetails } from '../../../src/features/map/ObservationDetails';

// Invented observation of our demo scenario.
const observation: Observation = {
  id: 'o-1', cruiseId: 'c', time: '2026-03-10T06:00:00Z', position: { lat: 81.5, lon: 14.2, source: 'gps-serial' }, observerId: 'obs-mh',
  totalConcentration: 9,
  categories: [
    { partialConcentration: 6, stage: 'thick-first-year', floeSize: 'big-floe', thicknessCm: 140 },
    { partialConcentration: 3, stage: 'grey-white', thicknessCm: 20 },
  ],
  notes: '', photoIds: [], revision: 1, savedAt: '2026-03-10T06:03:00Z', savedBy: 'obs-mh', deviceId: 'd', deleted: false,
};

describe('map details', () => {
  it('names the ice types a, b as the form and the rules do, each in the egg code order', () => {
    render(<ObservationDetails observation={observation} observers={[{ id: 'obs-mh', name: 'Maren Holtvik', initials: 'MH' }]} onClose={() => undefined} />);
    expect(screen.getByText('Ice type a').nextElementSibling).toHaveTextContent('6/10 thick first year, big floe, 140 cm');
    expect(screen.getByText('Ice type b').nextElementSibling).toHaveTextContent('3/10 grey white, 20 cm');
    expect(screen.queryByText(/Ice type 1/)).toBeNull();
  });
});
