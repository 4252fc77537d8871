// A button that loads the About panel on demand, so its code stays out of the first paint.
import type { ComponentType } from 'preact';
import { useState } from 'preact/hooks';

type Panel =
  | { readonly kind: 'closed' | 'loading' | 'failed' }
  | { readonly kind: 'open'; readonly Panel: ComponentType };

export function AboutSection() {
  const [panel, setPanel] = useState<Panel>({ kind: 'closed' });

  const toggle = (): void => {
    if (panel.kind === 'open') {
      setPanel({ kind: 'closed' });
      return;
    }
    setPanel({ kind: 'loading' });
    import('./AboutPanel.js').then(
      (module) => setPanel({ kind: 'open', Panel: module.AboutPanel }),
      () => setPanel({ kind: 'failed' }),
    );
  };

  return (
    <div>
      <button type="button" aria-expanded={panel.kind === 'open'} onClick={toggle}>
        About this installation
      </button>
      {panel.kind === 'loading' && <p role="status">Loading…</p>}
      {panel.kind === 'failed' && (
        <p role="alert">This panel could not be loaded. Reload the app and try again.</p>
      )}
      {panel.kind === 'open' && <panel.Panel />}
    </div>
  );
}
