// A lazy screen whose code cannot be loaded (offline before the app's copy is complete) or that
// throws while drawing is shown as a message with "Try again"; the rest of the app stays.
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { Suspense, useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { retriableLazy, ScreenBoundary } from '../../src/app/ScreenBoundary';

function Harness({ lazyScreen, label }: { lazyScreen: ReturnType<typeof retriableLazy>; label: string }) {
  const [attempt, setAttempt] = useState(0);
  const { Screen } = lazyScreen;
  return (
    <div>
      <p>header stays</p>
      <ScreenBoundary
        key={attempt}
        screenLabel={label}
        onRetry={() => {
          lazyScreen.retry();
          setAttempt((n) => n + 1);
        }}
      >
        <Suspense fallback={<p>loading</p>}>
          <Screen />
        </Suspense>
      </ScreenBoundary>
    </div>
  );
}

describe('a screen that cannot be opened', () => {
  it('says its code could not be loaded, keeps the rest, and loads it on "Try again"', async () => {
    vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    let calls = 0;
    const lazyScreen = retriableLazy(() => {
      calls += 1;
      // The message Chromium gives for a module it could not fetch.
      if (calls === 1) return Promise.reject(new TypeError('Failed to fetch dynamically imported module: http://127.0.0.1/assets/MapScreen-x.js'));
      return Promise.resolve({ default: () => <h2>Ice map body</h2> });
    });
    render(<Harness lazyScreen={lazyScreen} label="Ice map" />);
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Ice map could not be opened');
    expect(alert).toHaveTextContent('could not be loaded (Failed to fetch dynamically imported module');
    expect(alert).toHaveTextContent('ready for offline use');
    expect(screen.getByText('header stays')).toBeInTheDocument();

    await userEvent.setup().click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByRole('heading', { name: 'Ice map body' })).toBeInTheDocument();
    expect(screen.queryByRole('alert')).toBeNull();
    expect(calls).toBe(2);
  });

  it('names an error thrown while drawing, not a load failure', async () => {
    vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const Broken = () => {
      throw new Error('figures missing');
    };
    const lazyScreen = retriableLazy(() => Promise.resolve({ default: Broken }));
    render(<Harness lazyScreen={lazyScreen} label="Review" />);
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Review could not be opened');
    expect(alert).toHaveTextContent('The screen stopped with an error: figures missing');
    expect(alert).not.toHaveTextContent('ready for offline use');
    expect(screen.getByText('header stays')).toBeInTheDocument();
  });
});
