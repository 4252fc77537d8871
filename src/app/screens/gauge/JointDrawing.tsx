import { useId } from 'preact/hooks';
import { jointFamily, type Seam, type Side, type Toe } from '../../../domain/index.js';
import { buttGeometry, filletGeometry, toeKey, VIEW, type Point } from './joint-geometry.js';

type ToeKey = '1face' | '2face' | '1root' | '2root';

function ToeMark(props: {
  readonly at: Point;
  readonly chosen: boolean;
  readonly onPick: (() => void) | undefined;
}) {
  const { at, chosen } = props;
  return (
    <g class={chosen ? 'toe-mark toe-mark-chosen' : 'toe-mark'} onClick={props.onPick}>
      {/* A generous invisible hit area for a gloved finger; the labelled buttons are the accessible controls. */}
      <circle cx={at.x} cy={at.y} r={22} class="toe-hit" />
      {chosen ? (
        <>
          <circle cx={at.x} cy={at.y} r={11} class="toe-dot" />
          <circle cx={at.x} cy={at.y} r={16} class="toe-ring" />
        </>
      ) : (
        <circle cx={at.x} cy={at.y} r={8} class="toe-open" />
      )}
    </g>
  );
}

/**
 * The joint's cross-section with its toes marked: the chosen toe is a filled dot in a ring, the others open
 * circles (shape, not only colour). Tapping a toe on the drawing picks it too.
 */
export function JointDrawing(props: {
  readonly seam: Seam;
  readonly toe: Toe | null;
  readonly side: Side | null;
  readonly onPickToe?: (toe: Toe) => void;
}) {
  const { seam } = props;
  const t1 = seam.plate1.thickness;
  const t2 = seam.plate2.thickness;
  const chosenKey = props.toe ? toeKey(props.toe) : null;
  const pick = (key: ToeKey) =>
    props.onPickToe
      ? () =>
          props.onPickToe?.({
            plate: key.startsWith('1') ? 1 : 2,
            side: key.endsWith('face') ? 'face' : 'root',
          })
      : undefined;
  const marks = (toes: Readonly<Partial<Record<ToeKey, Point>>>) =>
    props.toe === null
      ? null
      : (Object.entries(toes) as [ToeKey, Point][]).map(([key, at]) => (
          <ToeMark key={key} at={at} chosen={key === chosenKey} onPick={pick(key)} />
        ));
  const hatch = `weld-hatch-${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const title = `Cross-section of the ${seam.joint.type === 'butt' ? 'butt' : seam.joint.type} joint`;

  if (jointFamily(seam.joint.type) === 'butt') {
    const g = buttGeometry(t1, t2);
    return (
      <svg class="joint-drawing" viewBox={`0 0 ${VIEW.width} ${VIEW.height}`} role="img" aria-label={title}>
        <defs>
          <pattern
            id={hatch}
            width="6"
            height="6"
            patternUnits="userSpaceOnUse"
            patternTransform="rotate(45)"
          >
            <line x1="0" y1="0" x2="0" y2="6" class="hatch-line" />
          </pattern>
        </defs>
        {props.side === 'face' ? (
          <rect x={0} y={0} width={VIEW.width} height={g.faceY + 10} class="side-band" />
        ) : null}
        {props.side === 'root' ? (
          <rect
            x={0}
            y={g.rootY - 10}
            width={VIEW.width}
            height={VIEW.height - g.rootY + 10}
            class="side-band"
          />
        ) : null}
        <polygon points={g.plate1} class="plate" />
        <polygon points={g.plate2} class="plate" />
        <polygon points={g.groove} class="weld" fill={`url(#${hatch})`} />
        <path d={g.cap} class="weld" fill={`url(#${hatch})`} />
        <path d={g.root} class="weld" fill={`url(#${hatch})`} />
        <text x={60} y={92} class="plate-label">
          plate 1 · {t1} mm
        </text>
        <text x={260} y={92} class="plate-label" text-anchor="middle">
          plate 2 · {t2} mm
        </text>
        <text x={8} y={16} class={props.side === 'face' ? 'side-label side-label-chosen' : 'side-label'}>
          ▲ face side (cap)
        </text>
        <text x={8} y={164} class={props.side === 'root' ? 'side-label side-label-chosen' : 'side-label'}>
          ▼ root side (root bead)
        </text>
        {marks(g.toes)}
      </svg>
    );
  }
  const g = filletGeometry(t1, t2, seam.joint.sides === 'two');
  const leftX = 8;
  return (
    <svg class="joint-drawing" viewBox={`0 0 ${VIEW.width} ${VIEW.height}`} role="img" aria-label={title}>
      <defs>
        <pattern id={hatch} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <line x1="0" y1="0" x2="0" y2="6" class="hatch-line" />
        </pattern>
      </defs>
      {props.side === 'face' ? <rect x={0} y={0} width={150} height={g.mainTop} class="side-band" /> : null}
      {props.side === 'root' ? <rect x={170} y={0} width={150} height={g.mainTop} class="side-band" /> : null}
      <polygon points={g.main} class="plate" />
      <polygon points={g.attachment} class="plate" />
      <path d={g.faceFillet} class="weld" fill={`url(#${hatch})`} />
      {g.rootFillet ? <path d={g.rootFillet} class="weld" fill={`url(#${hatch})`} /> : null}
      <text x={160} y={16} class="plate-label" text-anchor="middle">
        {seam.joint.type === 'lap' ? 'plate 2' : 'attachment'} · {t2} mm
      </text>
      <text x={312} y={g.mainTop + 16} class="plate-label" text-anchor="end">
        {seam.joint.type === 'lap' ? 'plate 1' : 'main plate'} · {t1} mm
      </text>
      <text x={leftX} y={40} class={props.side === 'face' ? 'side-label side-label-chosen' : 'side-label'}>
        ◀ face side
      </text>
      <text
        x={312}
        y={40}
        text-anchor="end"
        class={props.side === 'root' ? 'side-label side-label-chosen' : 'side-label'}
      >
        root side ▶
      </text>
      {marks(g.toes)}
    </svg>
  );
}
