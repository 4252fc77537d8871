// The enrolment ticket as a QR code (SVG, drawn on the server; 4 modules of quiet zone).
import bwipjs from 'bwip-js';
import { trusted, type Html } from './html.js';

export function qrSvg(text: string): Html {
  // eclevel is a symbology option bwip-js passes on but does not declare.
  const options: bwipjs.RenderOptions & { eclevel: 'M' } = {
    bcid: 'qrcode',
    text,
    eclevel: 'M',
    scale: 4,
    paddingwidth: 8,
    paddingheight: 8,
    backgroundcolor: 'FFFFFF',
  };
  const svg = bwipjs.toSVG(options);
  // bwip-js output holds only its own shapes; the attributes added here make it accessible and sized by CSS.
  return trusted(svg.replace('<svg ', '<svg role="img" aria-label="Enrolment QR code" class="qr" '));
}
