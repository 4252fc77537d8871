// The aim box: the square in the middle of the picture that the user puts the tag in. Only that part of each
// frame is read (a Data Matrix reads reliably near the centre, and a smaller image reads faster), with a margin
// beyond the drawn box for a tag held a little off.

/** The aim box's side as a share of the picture's shorter side (drawn with the same share in CSS). */
export const AIM_SHARE = 0.6;
const READ_MARGIN = 1.25;

export interface Crop {
  readonly sx: number;
  readonly sy: number;
  readonly sw: number;
  readonly sh: number;
}

/** The part of a width × height frame that is read: the aim box and its margin, kept inside the frame. */
export function aimCrop(width: number, height: number): Crop {
  const side = Math.min(Math.min(width, height) * AIM_SHARE * READ_MARGIN, width, height);
  // 1D tags are wide: read the full width of the band the box spans.
  const sw = Math.min(width, Math.max(side, width * 0.9));
  return {
    sx: Math.round((width - sw) / 2),
    sy: Math.round((height - side) / 2),
    sw: Math.round(sw),
    sh: Math.round(side),
  };
}
