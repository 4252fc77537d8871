import { GRADE_CAUTION, INDICATIVE_CAUTION } from '../../domain/caution.js';

/** The safety caution, reachable from every results view. */
export function Caution({ indicative = false }: { readonly indicative?: boolean }) {
  return (
    <aside class="caution" aria-label="Caution">
      <p>
        <strong>Caution:</strong> {GRADE_CAUTION}
      </p>
      {indicative ? <p>{INDICATIVE_CAUTION}</p> : null}
    </aside>
  );
}
