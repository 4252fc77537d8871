// The symbols on a printed tag label, drawn by bwip-js as SVG (vector, so they print sharp at any label size),
// with the quiet zones the readers need: QR 4 modules, Data Matrix 2, Code 128 10. Loaded only by the tag sheet.
import { code128, datamatrix, drawingSVG, qrcode } from 'bwip-js/browser';

export type TwoD = 'qr' | 'dataMatrix';

/** Code 128 only for short printable ASCII: a long or non-ASCII tag would not fit or read the same everywhere. */
export const MAX_1D_LENGTH = 24;

export interface LabelCodes {
  /** SVG documents, shown through <img> (never placed into the page as markup). */
  readonly twoD: string;
  readonly oneD: string | null;
  /** Why there is no 1D barcode, when there is none. */
  readonly oneDMissing: string | null;
}

export function labelCodes(tag: string, kind: TwoD): LabelCodes {
  // bwip-js draws 2 units per 2D module and 1 per 1D module at scale 1; padding is in those units.
  const twoD =
    kind === 'qr'
      ? qrcode({ bcid: 'qrcode', text: tag, scale: 1, padding: 8 }, drawingSVG())
      : datamatrix({ bcid: 'datamatrix', text: tag, scale: 1, padding: 4 }, drawingSVG());
  if (!/^[\x20-\x7E]+$/.test(tag)) {
    return { twoD, oneD: null, oneDMissing: 'no barcode: the tag holds characters beyond plain ASCII' };
  }
  if (tag.length > MAX_1D_LENGTH) {
    return {
      twoD,
      oneD: null,
      oneDMissing: `no barcode: the tag is longer than ${MAX_1D_LENGTH} characters`,
    };
  }
  const oneD = code128(
    { bcid: 'code128', text: tag, scale: 1, height: 8, paddingwidth: 10, paddingheight: 0 },
    drawingSVG(),
  );
  return { twoD, oneD, oneDMissing: null };
}

export const svgDataUrl = (svg: string): string =>
  `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`;
