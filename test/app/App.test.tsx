import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { App } from '../../src/app/App';

describe('App shell', () => {
  it('shows the navigation caution and every screen button', () => {
    render(<App />);
    expect(screen.getByTestId('navigation-notice')).toHaveTextContent('Not for navigation');
    const nav = screen.getByRole('navigation', { name: 'Screens' });
    expect(nav.querySelectorAll('button')).toHaveLength(5);
  });

  it('switches screens and marks the current one', async () => {
    const user = userEvent.setup();
    render(<App />);
    await user.click(screen.getByRole('button', { name: 'Settings' }));
    expect(screen.getByRole('button', { name: 'Settings' })).toHaveAttribute('aria-current', 'page');
    // Screens other than the log are loaded lazily (issue 15): wait for the chunk.
    expect(await screen.findByRole('heading', { level: 2, name: 'Settings' }, { timeout: 10_000 })).toBeInTheDocument();
  });

  it('applies the chosen display theme to the document', async () => {
    const user = userEvent.setup();
    render(<App />);
    await user.selectOptions(screen.getByLabelText('Display theme'), 'night');
    expect(document.documentElement.dataset.theme).toBe('night');
  });
});
