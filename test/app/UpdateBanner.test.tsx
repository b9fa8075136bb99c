import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { UpdateBannerView, type UpdateBannerActions } from '../../src/app/UpdateBanner';
import type { PwaState, UpdatePhase } from '../../src/app/pwa';
import { onBeforeAppUpdate, runBeforeAppUpdate } from '../../src/state/app-update';

const actions = (): UpdateBannerActions => ({ apply: vi.fn(), postpone: vi.fn(), dismiss: vi.fn() });
const state = (phase: UpdatePhase, error: string | null = null): PwaState => ({ phase, build: 'b-42', error });

describe('update banner', () => {
  it('shows nothing when there is nothing to say', () => {
    const { container } = render(<UpdateBannerView state={state('idle')} actions={actions()} />);
    expect(container).toBeEmptyDOMElement();
  });

  it('asks before applying a new version and says the draft is kept', async () => {
    const user = userEvent.setup();
    const a = actions();
    render(<UpdateBannerView state={state('waiting')} actions={a} />);
    expect(screen.getByRole('region', { name: 'App version' })).toHaveTextContent('A new version of Floe Ledger is ready');
    expect(screen.getByRole('region', { name: 'App version' })).toHaveTextContent('draft observation is kept');
    expect(a.apply).not.toHaveBeenCalled();
    await user.click(screen.getByRole('button', { name: 'Later' }));
    expect(a.postpone).toHaveBeenCalledOnce();
    expect(a.apply).not.toHaveBeenCalled();
    await user.click(screen.getByRole('button', { name: 'Update now' }));
    expect(a.apply).toHaveBeenCalledOnce();
  });

  it('names why an update was held back', () => {
    render(<UpdateBannerView state={state('waiting', 'open work could not be saved first')} actions={actions()} />);
    expect(screen.getByRole('region', { name: 'App version' })).toHaveTextContent('Not updated: open work could not be saved first.');
  });

  it('after an update, names the build now running', () => {
    render(<UpdateBannerView state={state('updated')} actions={actions()} />);
    expect(screen.getByRole('region', { name: 'App version' })).toHaveTextContent('build b-42');
  });

  it('tells a window that another one applied the update, and offers a reload', async () => {
    const user = userEvent.setup();
    const a = actions();
    render(<UpdateBannerView state={state('updated-elsewhere')} actions={a} />);
    await user.click(screen.getByRole('button', { name: 'Reload now' }));
    expect(a.apply).toHaveBeenCalledOnce();
  });
});

describe('flushes before an update', () => {
  it('runs every registered flush and reports the first failure', async () => {
    const done: string[] = [];
    const offA = onBeforeAppUpdate(async () => {
      done.push('a');
    });
    const offB = onBeforeAppUpdate(() => {
      throw new Error('disk full');
    });
    await expect(runBeforeAppUpdate()).rejects.toThrow('disk full');
    expect(done).toEqual(['a']);
    offB();
    await expect(runBeforeAppUpdate()).resolves.toBeUndefined();
    offA();
  });
});
