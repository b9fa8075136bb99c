// A screen that cannot be loaded or drawn must not take the whole app with it: the watch log,
// the header and the banners stay, and the observer gets the reason and a way to try again.
// The usual cause is a lazy screen's code asked for offline before this laptop holds a complete
// copy of the app (the service worker precaches every chunk on the first online visit).
import { Component, lazy, type ComponentType, type ErrorInfo, type LazyExoticComponent, type ReactNode } from 'react';

/** A lazy component that can be asked for again after its code failed to load. */
export interface RetriableLazy {
  /** Stable across retries: it draws whichever lazy component is current. */
  Screen: ComponentType;
  retry: () => void;
}

export function retriableLazy(load: () => Promise<{ default: ComponentType }>): RetriableLazy {
  // React's lazy() keeps a rejected promise for good, so a retry needs a new lazy component.
  let component: LazyExoticComponent<ComponentType> = lazy(load);
  function Screen() {
    const Current = component;
    return <Current />;
  }
  return {
    Screen,
    retry: () => {
      component = lazy(load);
    },
  };
}

interface Props {
  screenLabel: string;
  onRetry: () => void;
  children: ReactNode;
}

interface State {
  error: Error | null;
}

const isLoadFailure = (e: Error) => /dynamically imported module|Importing a module script failed|error loading dynamically|Failed to fetch/i.test(e.message);

export class ScreenBoundary extends Component<Props, State> {
  override state: State = { error: null };

  static getDerivedStateFromError(error: unknown): State {
    return { error: error instanceof Error ? error : new Error(String(error)) };
  }

  override componentDidCatch(error: unknown, info: ErrorInfo): void {
    // Kept in the console for whoever looks after the laptop; the screen says it in words.
    console.warn(`Floe Ledger: the ${this.props.screenLabel} screen failed`, error, info.componentStack);
  }

  private readonly retry = () => {
    this.props.onRetry();
    this.setState({ error: null });
  };

  override render(): ReactNode {
    const { error } = this.state;
    if (!error) return this.props.children;
    const { screenLabel } = this.props;
    return (
      <section role="alert" className="screen-failed" data-testid="screen-failed">
        <h2>{screenLabel} could not be opened</h2>
        {isLoadFailure(error) ? (
          <p>
            The code of this screen could not be loaded ({error.message}). Without a network, screens come from this
            laptop&apos;s own copy of the app, which is complete once the app has said it is ready for offline use; open it
            once with a network to finish that copy.
          </p>
        ) : (
          <p>The screen stopped with an error: {error.message}</p>
        )}
        <p>The watch log and everything saved are not affected.</p>
        <button type="button" onClick={this.retry}>
          Try again
        </button>
      </section>
    );
  }
}
