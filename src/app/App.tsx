import { lazy, Suspense, useEffect } from 'react';
import { SCREENS, useNavigation, type Screen } from '../state/navigation';
import { effectiveTheme, useThemeStore, type ThemeMode } from '../state/theme';
import { LogScreen } from '../features/log/LogScreen';
import { NavigationNotice } from './NavigationNotice';
import { UpdateBanner } from './UpdateBanner';
import { LogBackground } from '../features/log/LogBackground';
import { DatabaseStatus } from '../features/settings/DatabaseStatus';
import { SyncBadge } from '../features/sync/SyncBadge';
import { SyncRunner } from '../features/sync/SyncRunner';

// The watch log is in the first bundle: it must be interactive at once. The other screens (the
// map with MapLibre, the review with its charts, the exchange with its validators and zip code)
// load when first opened; the service worker precaches every chunk, so this works offline too.
const MapScreen = lazy(() => import('../features/map/MapScreen').then((m) => ({ default: m.MapScreen })));
const ReviewScreen = lazy(() => import('../features/review/ReviewScreen').then((m) => ({ default: m.ReviewScreen })));
const ExchangeScreen = lazy(() => import('../features/exchange/ExchangeScreen').then((m) => ({ default: m.ExchangeScreen })));
const SettingsScreen = lazy(() => import('../features/settings/SettingsScreen').then((m) => ({ default: m.SettingsScreen })));

const SCREEN_LABELS: Record<Screen, string> = {
  log: 'Watch log',
  map: 'Ice map',
  review: 'Review',
  exchange: 'Exchange',
  settings: 'Settings',
};

const THEME_LABELS: Record<ThemeMode, string> = {
  day: 'Day',
  night: 'Night',
  red: 'Night red',
  auto: 'Auto (sun)',
};

function ScreenBody({ screen }: { screen: Screen }) {
  switch (screen) {
    case 'log':
      return <LogScreen />;
    case 'map':
      return <MapScreen />;
    case 'review':
      return <ReviewScreen />;
    case 'exchange':
      return <ExchangeScreen />;
    case 'settings':
      return <SettingsScreen />;
  }
}

export function App() {
  const screen = useNavigation((s) => s.screen);
  const go = useNavigation((s) => s.go);
  const mode = useThemeStore((s) => s.mode);
  const autoTheme = useThemeStore((s) => s.autoTheme);
  const setMode = useThemeStore((s) => s.setMode);
  const theme = effectiveTheme({ mode, autoTheme });

  useEffect(() => {
    document.documentElement.dataset.theme = theme;
  }, [theme]);

  return (
    <div className="app" data-theme={theme}>
      <header className="app-header">
        <h1 className="app-title">Floe Ledger</h1>
        <nav aria-label="Screens" className="app-nav">
          {SCREENS.map((s) => (
            <button
              key={s}
              type="button"
              className="nav-button"
              aria-current={s === screen ? 'page' : undefined}
              onClick={() => go(s)}
            >
              {SCREEN_LABELS[s]}
            </button>
          ))}
        </nav>
        <label className="theme-switch">
          <span>Display</span>
          <select value={mode} onChange={(e) => setMode(e.target.value as ThemeMode)} aria-label="Display theme">
            {(Object.keys(THEME_LABELS) as ThemeMode[]).map((m) => (
              <option key={m} value={m}>
                {THEME_LABELS[m]}
              </option>
            ))}
          </select>
        </label>
      </header>
      <SyncBadge />
      <SyncRunner />
      <NavigationNotice />
      <UpdateBanner />
      <LogBackground />
      <DatabaseStatus />
      <main className="app-main" id="main">
        <Suspense fallback={<p role="status">Opening {SCREEN_LABELS[screen]}…</p>}>
          <ScreenBody screen={screen} />
        </Suspense>
      </main>
    </div>
  );
}
