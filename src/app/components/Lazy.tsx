import type { ComponentType } from 'preact';
import { useEffect, useState } from 'preact/hooks';

/** Loads a screen module on first use, so the first paint carries only the Seams list. */
export function Lazy<P extends object>(props: {
  readonly load: () => Promise<{ default: ComponentType<P> }>;
  readonly props: P;
}) {
  const [Component, setComponent] = useState<ComponentType<P> | null>(null);
  const [failed, setFailed] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    props.load().then(
      (m) => live && setComponent(() => m.default),
      (e: unknown) => live && setFailed(e instanceof Error ? e.message : String(e)),
    );
    return () => {
      live = false;
    };
  }, [props.load]);
  if (failed)
    return <p role="alert">This screen could not be loaded ({failed}). Reload the app to try again.</p>;
  if (!Component) return <p aria-busy="true">Loading…</p>;
  return <Component {...props.props} />;
}
