import { Component, type ReactNode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './ui/App';
import './ui/styles.css';

// Last line of defence: a render error shows a message and a way back to the demo, never a blank page.
class Guard extends Component<{ children: ReactNode }, { error: Error | null }> {
  override state = { error: null as Error | null };
  static getDerivedStateFromError(error: Error) {
    return { error };
  }
  override render() {
    if (!this.state.error) return this.props.children;
    return (
      <main className="crash" role="alert">
        <h1>Swathe hit a problem</h1>
        <p>{this.state.error.message}</p>
        <p>
          <button type="button" onClick={() => { window.location.search = ''; }}>Open the demo scenario</button>{' '}
          <button type="button" onClick={() => window.location.reload()}>Reload</button>
        </p>
      </main>
    );
  }
}

// No StrictMode: its dev-only double mount tears down the worker, the WebGL
// renderer and the map caches, so `npm start` would differ from the build.
createRoot(document.getElementById('root')!).render(
  <Guard>
    <App />
  </Guard>,
);
