// Tag text read from a label (camera, photo or typed): what is kept, what two tags are compared by, and what is
// shown. Tag text is data from the outside world: it is never interpreted, only cleaned to well-formed Unicode,
// compared by a folded key and shown with invisible characters made visible.

/** The most a tag may hold, in UTF-16 code units (the same bound as a seam set-up's tag). */
export const MAX_TAG_LENGTH = 256;

export type TagText =
  | {
      readonly ok: true;
      /** What is stored and synced: well-formed, NFC, without surrounding white space. */
      readonly tag: string;
      /** What two tags are compared by: NFKC, white space runs as one space, upper case. */
      readonly key: string;
    }
  | { readonly ok: false; readonly problem: 'empty' | 'tooLong'; readonly message: string };

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
// Scanners end a read with CR, LF or Tab; C0 controls and white space around the text are not part of the tag.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const EDGES = /^[\s\u0000-\u001F\u007F]+|[\s\u0000-\u001F\u007F]+$/g;

/** Cleans raw tag text and says whether it can be a tag. */
export function readTagText(raw: string): TagText {
  // A megabyte of noise is not a tag: judge its length before spending work on it.
  if (raw.length > MAX_TAG_LENGTH * 8) return tooLong(raw.length);
  const tag = raw.replace(LONE_SURROGATE, '\uFFFD').normalize('NFC').replace(EDGES, '');
  if (!tag) {
    return {
      ok: false,
      problem: 'empty',
      message: 'The tag is empty: nothing readable was found. Scan again, or type the tag.',
    };
  }
  if (tag.length > MAX_TAG_LENGTH) return tooLong(tag.length);
  return { ok: true, tag, key: tagKey(tag) };
}

function tooLong(length: number): TagText {
  return {
    ok: false,
    problem: 'tooLong',
    message: `The tag is ${length} characters long; a tag may hold at most ${MAX_TAG_LENGTH}. This is not a seam tag: check the label.`,
  };
}

/**
 * The key tags are matched by: a typed "kp-014", a full-width "ＫＰ－０１４" and a scanned "KP-014" are one tag
 * (gloved typing is rough; yard tags are not told apart by case).
 */
export function tagKey(tag: string): string {
  return tag.normalize('NFKC').replace(/\s+/g, ' ').trim().toUpperCase();
}

// Controls, and format characters that reorder or hide text (bidi overrides, zero-width), would let a tag look
// like another: they are shown as visible marks.
const INVISIBLE =
  // eslint-disable-next-line no-control-regex -- matching control characters is the point
  /[\u0000-\u001F\u007F-\u009F\u00AD\u061C\u180E\u200B-\u200F\u202A-\u202E\u2060-\u206F\uFEFF]/g;

/** The tag as shown: every control and invisible format character made visible; the rest as it is. */
export function shownTag(tag: string): string {
  return tag.replace(INVISIBLE, (c) => {
    const code = c.charCodeAt(0);
    if (code < 0x20) return String.fromCharCode(0x2400 + code);
    if (code === 0x7f) return '\u2421';
    return `⟨U+${code.toString(16).toUpperCase().padStart(4, '0')}⟩`;
  });
}

/** The shown tag cut to `max` characters with an ellipsis, for lists; the full text goes in a title. */
export function shortTag(tag: string, max = 40): string {
  const shown = shownTag(tag);
  const chars = [...shown];
  return chars.length <= max ? shown : `${chars.slice(0, max - 1).join('')}…`;
}
