// The supervisor's tag sheet: a label per tag of the chosen seams, drawn with the tablet's own label module
// (bwip-js SVG: a QR code or Data Matrix, and a Code 128 for short ASCII tags) on the tablet's sheet layouts.
// On screen a preview; printed, only the sheets, labels placed in millimetres.
import { labelCodes, svgDataUrl, type TwoD } from '../../app/tags/label-codes.js';
import { paginate, SHEET_LAYOUTS, type SheetLayout } from '../../app/tags/label-sheets.js';
import { html, type Html } from './html.js';
import { layout as pageLayout } from './pages.js';

export interface SheetSeam {
  readonly id: string;
  readonly label: string;
  readonly tags: readonly string[];
}

export interface SheetChoice {
  readonly layout: SheetLayout;
  readonly symbol: TwoD;
}

/** The layout and symbol asked for, or the first layout and QR. */
export function sheetChoice(query: URLSearchParams): SheetChoice {
  return {
    layout: SHEET_LAYOUTS.find((l) => l.id === query.get('layout')) ?? (SHEET_LAYOUTS[0] as SheetLayout),
    symbol: query.get('symbol') === 'dataMatrix' ? 'dataMatrix' : 'qr',
  };
}

/** One label per tag, in the order of the seams. */
export const sheetLabels = (seams: readonly SheetSeam[]) =>
  seams.flatMap((s) => s.tags.map((tag) => ({ tag, seam: s })));

function label(tag: string, seam: SheetSeam, symbol: TwoD): Html {
  const codes = labelCodes(tag, symbol);
  return html`<div class="tag-label" data-tag="${tag}">
    <img
      class="label-2d"
      src="${svgDataUrl(codes.twoD)}"
      alt="${symbol === 'qr' ? 'QR code' : 'Data Matrix'} of ${tag}"
    />
    <div class="label-side">
      ${
        codes.oneD
          ? html`<img class="label-1d" src="${svgDataUrl(codes.oneD)}" alt="Code 128 of ${tag}" />`
          : html`<span class="label-missing">${codes.oneDMissing}</span>`
      }
      <span class="label-tag">${tag}</span>
      <span class="label-seam">${seam.label}</span>
    </div>
  </div>`;
}

export function tagSheetPage(input: {
  readonly user: string;
  readonly seams: readonly SheetSeam[];
  readonly choice: SheetChoice;
  /** The query that chose the seams, kept when the layout or symbol is changed. */
  readonly selection: readonly [string, string][];
  readonly max: number;
}): string {
  const { choice } = input;
  const all = sheetLabels(input.seams);
  const labels = all.slice(0, input.max);
  const untagged = input.seams.filter((s) => s.tags.length === 0);
  const pages = paginate(labels, choice.layout);
  return pageLayout(
    'Tag sheet',
    html`<div class="no-print">
        <p><a href="/supervisor/seams">← Seams</a></p>
        <h1>Tag sheet</h1>
        <p role="status">
          ${`${labels.length} label${labels.length === 1 ? '' : 's'} for ${input.seams.length} seam${input.seams.length === 1 ? '' : 's'}, on ${pages.length} sheet${pages.length === 1 ? '' : 's'}.`}
          ${all.length > labels.length ? `Only the first ${labels.length} of ${all.length} labels: choose fewer seams to print the rest.` : ''}
        </p>
        ${
          untagged.length
            ? html`<p class="error">
                No label for ${untagged.map((s) => s.label).join(', ')}:
                ${untagged.length === 1 ? 'it has' : 'they have'} no tag yet. Give tags in the seam list's
                Tags column, or on the tablet (Print a tag label).
              </p>`
            : ''
        }
        <form method="get" action="/supervisor/seams/tags">
          ${input.selection.map(([k, v]) => html`<input type="hidden" name="${k}" value="${v}" />`)}
          <label
            >Sheet
            <select name="layout">
              ${SHEET_LAYOUTS.map(
                (l) =>
                  html`<option value="${l.id}" ${l.id === choice.layout.id ? html`selected` : ''}>
                    ${l.name}
                  </option>`,
              )}
            </select></label
          >
          <label
            >Code
            <select name="symbol">
              <option value="qr" ${choice.symbol === 'qr' ? html`selected` : ''}>QR code</option>
              <option value="dataMatrix" ${choice.symbol === 'dataMatrix' ? html`selected` : ''}>
                Data Matrix
              </option>
            </select></label
          >
          <button type="submit">Show</button>
        </form>
        <p>
          <button type="button" data-print>Print</button> at 100 % (“actual size”), headers and footers off.
        </p>
      </div>
      ${pages.map(
        (page, i) =>
          html`<div
            class="sheet-page sheet-${choice.layout.id}"
            data-page="${choice.layout.page}"
            aria-label="Sheet ${i + 1} of ${pages.length}"
          >
            ${page.map((l) => label(l.tag, l.seam, choice.symbol))}
          </div>`,
      )}`,
    input.user,
    { bodyClass: 'wide', script: '/supervisor/review/print.js' },
  );
}
