import type { RenderableProps } from 'preact';
import { useEffect, useMemo, useState } from 'preact/hooks';
import { shownTag, tagKey } from '../../domain/tags/tag-text.js';
import type { SeamRecord, TagLinkRecord } from '../../store/api.js';
import { getStore } from '../services/store.js';
import type { LabelCodes, TwoD } from '../tags/label-codes.js';
import { mintTag, paginate, SHEET_LAYOUTS, type SheetLayout } from '../tags/label-sheets.js';
import './tag-sheet.css';

const loadCodes = () => import('../tags/label-codes.js');

interface Label {
  readonly tag: string;
  readonly seamLabel: string;
}

/** Every tag of a seam (linked, then listed in its set-up), each once. */
function tagsOf(seam: SeamRecord, links: readonly TagLinkRecord[]): string[] {
  const seen = new Set<string>();
  const out: string[] = [];
  for (const tag of [
    ...links.filter((l) => l.seamId === seam.id).map((l) => l.tag),
    ...(seam.seam.tags ?? []),
  ]) {
    const key = tagKey(tag);
    if (!seen.has(key)) {
      seen.add(key);
      out.push(tag);
    }
  }
  return out;
}

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

/** Printable tag labels for chosen seams: a 2D code, a Code 128 barcode and the tag and seam in words. */
export default function TagSheetScreen({
  seamIds,
}: RenderableProps<{ readonly seamIds: readonly string[] }>) {
  const [seams, setSeams] = useState<SeamRecord[] | null>(null);
  const [links, setLinks] = useState<TagLinkRecord[]>([]);
  const [chosen, setChosen] = useState<ReadonlySet<string>>(() => new Set(seamIds));
  const [layoutId, setLayoutId] = useState<SheetLayout['id']>('a4-3x8');
  const [kind, setKind] = useState<TwoD>('qr');
  const [codes, setCodes] = useState<ReadonlyMap<string, LabelCodes> | null>(null);
  const [error, setError] = useState<string | null>(null);

  const load = async () => {
    const store = await getStore();
    setSeams(await store.listSeams());
    setLinks(await store.listTagLinks());
  };
  useEffect(() => {
    load().catch((e: unknown) => setError(errorText(e)));
  }, []);

  const layout = SHEET_LAYOUTS.find((l) => l.id === layoutId) ?? (SHEET_LAYOUTS[0] as SheetLayout);
  const picked = useMemo(() => (seams ?? []).filter((s) => chosen.has(s.id)), [seams, chosen]);
  const labels: Label[] = picked.flatMap((s) =>
    tagsOf(s, links).map((tag) => ({ tag, seamLabel: s.seam.label })),
  );
  const untagged = picked.filter((s) => tagsOf(s, links).length === 0);
  const labelKey = labels.map((l) => l.tag).join('\u0000');

  useEffect(() => {
    let live = true;
    setCodes(null);
    loadCodes().then(
      (m) => {
        const made = new Map<string, LabelCodes>();
        for (const l of labels) {
          try {
            made.set(l.tag, m.labelCodes(l.tag, kind));
          } catch (e) {
            setError(`A code for the tag “${shownTag(l.tag)}” could not be drawn: ${errorText(e)}`);
          }
        }
        if (live) setCodes(made);
      },
      (e: unknown) => live && setError(`The label generator could not be loaded: ${errorText(e)}`),
    );
    return () => {
      live = false;
    };
  }, [labelKey, kind]);

  const giveNewTags = async () => {
    setError(null);
    try {
      const store = await getStore();
      for (const s of untagged) await store.linkTag(s.id, mintTag(s.id), 'printed');
      await load();
    } catch (e) {
      setError(errorText(e));
    }
  };

  const toggle = (id: string) =>
    setChosen((c) => {
      const next = new Set(c);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  if (seams === null) return <p aria-busy="true">Loading seams…</p>;
  return (
    <section class="tag-sheet-screen" aria-labelledby="sheet-title">
      <div class="sheet-controls">
        <h1 id="sheet-title">Tag sheet</h1>
        <fieldset>
          <legend>Seams to label</legend>
          <ul class="sheet-seams">
            {seams.map((s) => (
              <li key={s.id}>
                <label>
                  <input type="checkbox" checked={chosen.has(s.id)} onChange={() => toggle(s.id)} />{' '}
                  {s.seam.label}
                </label>
              </li>
            ))}
          </ul>
        </fieldset>
        <div class="sheet-options">
          <label>
            Sheet{' '}
            <select
              value={layoutId}
              onChange={(e) => setLayoutId((e.target as HTMLSelectElement).value as SheetLayout['id'])}
            >
              {SHEET_LAYOUTS.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.name}
                </option>
              ))}
            </select>
          </label>
          <label>
            Square code{' '}
            <select value={kind} onChange={(e) => setKind((e.target as HTMLSelectElement).value as TwoD)}>
              <option value="qr">QR code</option>
              <option value="dataMatrix">Data Matrix</option>
            </select>
          </label>
        </div>
        {untagged.length ? (
          <p class="note">
            {untagged.length === 1 ? 'One chosen seam has' : `${untagged.length} chosen seams have`} no tag
            yet ({untagged.map((s) => s.seam.label).join(', ')}).{' '}
            <button type="button" onClick={() => void giveNewTags()}>
              Give {untagged.length === 1 ? 'it a new tag' : 'each a new tag'}
            </button>
          </p>
        ) : null}
        {error ? (
          <p role="alert" class="banner banner-bad">
            ⚠ {error}
          </p>
        ) : null}
        <div class="actions">
          <button
            type="button"
            class="primary"
            disabled={!labels.length || !codes}
            onClick={() => window.print()}
          >
            Print {labels.length} {labels.length === 1 ? 'label' : 'labels'}
          </button>
        </div>
        <p class="note">
          Print at 100 % (“actual size”), without headers and footers, so labels land on the sheet.
        </p>
      </div>
      <style>{`@page { size: ${layout.page === 'A4' ? 'A4' : 'letter'}; margin: 0; }`}</style>
      {codes ? (
        <Sheet layout={layout} labels={labels} codes={codes} />
      ) : labels.length ? (
        <p aria-busy="true">Drawing the codes…</p>
      ) : null}
    </section>
  );
}

function Sheet({
  layout,
  labels,
  codes,
}: {
  readonly layout: SheetLayout;
  readonly labels: readonly Label[];
  readonly codes: ReadonlyMap<string, LabelCodes>;
}) {
  const [svgUrl, setSvgUrl] = useState<((svg: string) => string) | null>(null);
  useEffect(() => {
    void loadCodes().then((m) => setSvgUrl(() => m.svgDataUrl));
  }, []);
  if (!svgUrl) return null;
  const grid = {
    gridTemplateColumns: `repeat(${layout.columns}, ${layout.labelWidthMm}mm)`,
    gridAutoRows: `${layout.labelHeightMm}mm`,
    paddingTop: `${layout.topMm}mm`,
    paddingLeft: `${layout.leftMm}mm`,
  };
  return (
    <div class="sheet" data-layout={layout.id}>
      {paginate(labels, layout).map((page, p) => (
        <div class="sheet-page" data-page={layout.page} style={grid} key={p}>
          {page.map((l, i) => {
            const c = codes.get(l.tag);
            return (
              <div class="tag-label" key={`${i}-${l.tag}`}>
                {c ? (
                  <img class="label-2d" src={svgUrl(c.twoD)} alt={`Square code for tag ${shownTag(l.tag)}`} />
                ) : null}
                <div class="label-side">
                  {c?.oneD ? (
                    <img
                      class="label-1d"
                      src={svgUrl(c.oneD)}
                      alt={`Code 128 barcode for tag ${shownTag(l.tag)}`}
                    />
                  ) : (
                    <span class="label-missing">{c?.oneDMissing ?? ''}</span>
                  )}
                  <span class="label-tag">{shownTag(l.tag)}</span>
                  <span class="label-seam">{l.seamLabel}</span>
                </div>
              </div>
            );
          })}
        </div>
      ))}
    </div>
  );
}
