// The tag sheet's print rules for the supervisor's pages. The page's CSP allows no inline styles, so each sheet
// layout's grid (label size and page margins, in millimetres as the sheets are sold) is a class made here from
// the tablet's own layouts.
import { SHEET_LAYOUTS } from '../../app/tags/label-sheets.js';

const grids = SHEET_LAYOUTS.map(
  (l) =>
    `.sheet-${l.id} { grid-template-columns: repeat(${l.columns}, ${l.labelWidthMm}mm); ` +
    `grid-auto-rows: ${l.labelHeightMm}mm; padding: ${l.topMm}mm 0 0 ${l.leftMm}mm; }`,
).join('\n');

export const TAG_SHEET_CSS = `
.sheet-page { display: grid; box-sizing: border-box; background: #fff; margin: 1rem 0; outline: 1px solid #999; }
.sheet-page[data-page='A4'] { width: 210mm; min-height: 297mm; page: sheet-a4; }
.sheet-page[data-page='letter'] { width: 215.9mm; min-height: 279.4mm; page: sheet-letter; }
${grids}
.tag-label { box-sizing: border-box; display: flex; align-items: center; gap: 2mm; padding: 2mm 3mm; overflow: hidden;
  outline: 1px dashed #bbb; }
.label-2d { height: 100%; max-height: 32mm; aspect-ratio: 1; flex: none; }
.label-side { display: flex; flex-direction: column; min-width: 0; gap: 1mm; }
.label-1d { width: 100%; height: 8mm; object-fit: fill; }
.label-tag { font: 700 11pt ui-monospace, monospace; overflow-wrap: anywhere; }
.label-seam, .label-missing { font-size: 8pt; overflow-wrap: anywhere; }
@page sheet-a4 { size: A4; margin: 0; }
@page sheet-letter { size: letter; margin: 0; }
@media print {
  .sheet-page { margin: 0; outline: none; break-after: page; }
  .tag-label { outline: none; }
}
`;
