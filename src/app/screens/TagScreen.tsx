import type { RenderableProps } from 'preact';
import { useEffect, useRef, useState } from 'preact/hooks';
import { shownTag } from '../../domain/index.js';
import type { TagVia } from '../../store/api.js';
import { StoreError } from '../../store/index.js';
import { hrefOf, navigate } from '../router.js';
import { aimCrop } from '../../../workers/tag-aim.js';
import { setTorch, startRearCamera, stopCamera, torchTrack } from '../scan/camera.js';
import { decodeBitmap } from '../scan/decoder.js';
import { setPendingTag } from '../scan/pending-tag.js';
import { resolveTag, type TagResolution } from '../scan/resolve.js';
import { getStore } from '../services/store.js';
import './tag.css';

type Camera =
  | { readonly state: 'off' }
  | { readonly state: 'starting' }
  | { readonly state: 'on'; readonly torch: MediaStreamTrack | null }
  | { readonly state: 'failed'; readonly message: string };

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e));

/** A tag as text (never markup), invisible characters shown, the full text in a tooltip. */
function TagText({ tag }: { readonly tag: string }) {
  return (
    <code class="tag-text" title={tag}>
      {shownTag(tag)}
    </code>
  );
}

/**
 * The Tag screen (`#/tag`, or `#/tag/<seam>` from a seam): reads a tag with the rear camera, from a photo, or
 * typed, and follows the linking rules. `seamId` is the seam the user came from: the "current seam".
 */
export default function TagScreen({ seamId }: RenderableProps<{ readonly seamId?: string | undefined }>) {
  const current = seamId ?? null;
  const video = useRef<HTMLVideoElement>(null);
  const stream = useRef<MediaStream | null>(null);
  const [camera, setCamera] = useState<Camera>({ state: 'off' });
  const [torchOn, setTorchOn] = useState(false);
  const [status, setStatus] = useState('');
  const [result, setResult] = useState<TagResolution | null>(null);
  const [typed, setTyped] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [currentLabel, setCurrentLabel] = useState<string | null>(null);

  useEffect(() => {
    if (current === null) return;
    void getStore()
      .then((s) => s.getSeam(current))
      .then((rec) => setCurrentLabel(rec?.seam.label ?? null));
  }, [current]);

  const stop = () => {
    stopCamera(stream.current);
    stream.current = null;
    setCamera((c) => (c.state === 'failed' ? c : { state: 'off' }));
    setTorchOn(false);
  };

  const handle = async (text: string, via: TagVia) => {
    setError(null);
    const resolution = await resolveTag(await getStore(), text, via, current);
    if (resolution.kind === 'resolved' && resolution.outcome.kind === 'open') {
      navigate({ name: 'seam', id: resolution.outcome.seamId });
      return;
    }
    setResult(resolution);
  };

  const start = async () => {
    setResult(null);
    setCamera({ state: 'starting' });
    const started = await startRearCamera();
    if (!started.ok) {
      setCamera({ state: 'failed', message: started.message });
      return;
    }
    stream.current = started.stream;
    const el = video.current;
    if (!el) return stop();
    el.srcObject = started.stream;
    await el.play().catch(() => undefined);
    setCamera({ state: 'on', torch: torchTrack(started.stream) });
    setStatus('Hold the tag inside the box.');
    void scanLoop(el, started.stream);
  };

  /** Reads frames one after another (never two at once) until a tag is found or the camera stops. */
  const scanLoop = async (el: HTMLVideoElement, own: MediaStream) => {
    let frame = 0;
    while (stream.current === own) {
      if (el.readyState < 2 || !el.videoWidth) {
        await new Promise((r) => setTimeout(r, 50));
        continue;
      }
      const crop = aimCrop(el.videoWidth, el.videoHeight);
      let found = null;
      try {
        const bitmap = await createImageBitmap(el, crop.sx, crop.sy, crop.sw, crop.sh);
        // Camera frames come ten a second: each is read one way round, quickly, so a frame with no tag (most of
        // them while aiming) stays short; dark-on-light and light-on-dark alternate.
        found = await decodeBitmap(bitmap, undefined, {
          tryHarder: false,
          polarity: frame++ % 2 === 0 ? 'normal' : 'inverted',
        });
      } catch (e) {
        setStatus(`A frame could not be read (${errorText(e)}); still trying.`);
      }
      if (stream.current !== own) return;
      if (found) {
        stop();
        setStatus(`Read a ${symbolName[found.symbol]}.`);
        await handle(found.text, 'camera');
        return;
      }
      await new Promise((r) => setTimeout(r, 30));
    }
  };

  useEffect(() => {
    void start();
    return () => {
      stopCamera(stream.current);
      stream.current = null;
    };
  }, []);

  const toggleTorch = async () => {
    if (camera.state !== 'on' || !camera.torch) return;
    try {
      await setTorch(camera.torch, !torchOn);
      setTorchOn(!torchOn);
    } catch (e) {
      setStatus(`The torch could not be switched (${errorText(e)}).`);
    }
  };

  const fromPhoto = async (file: File | undefined) => {
    if (!file) return;
    stop();
    setBusy(true);
    setStatus('Reading the photo…');
    try {
      const found = await decodeBitmap(await createImageBitmap(file), 1600);
      if (found) {
        setStatus(`Read a ${symbolName[found.symbol]} from the photo.`);
        await handle(found.text, 'photo');
      } else {
        setStatus('');
        setError(
          'No tag was found in this photo. Take it closer and straight on, with the whole tag in the picture, or type the tag.',
        );
      }
    } catch (e) {
      setError(`The photo could not be read (${errorText(e)}). Try another photo, or type the tag.`);
    } finally {
      setBusy(false);
    }
  };

  const act = async (work: () => Promise<string>) => {
    setBusy(true);
    setError(null);
    try {
      navigate({ name: 'seam', id: await work() });
    } catch (e) {
      if (e instanceof StoreError && e.code === 'conflict' && result?.kind === 'resolved') {
        // Someone linked the tag meanwhile: show what holds now instead of moving it.
        await handle(result.tag, result.via);
      } else setError(errorText(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <section class="tag-screen" aria-labelledby="tag-title">
      <h1 id="tag-title">Scan a tag</h1>
      {current !== null ? (
        <p class="note">
          Current seam: <strong>{currentLabel ?? current}</strong>
        </p>
      ) : null}
      <div class="scan-view" data-camera={camera.state}>
        <video ref={video} muted playsInline aria-label="Camera picture" />
        <div class="aim-box" aria-hidden="true" />
      </div>
      <p class="scan-status" aria-live="polite">
        {camera.state === 'starting'
          ? 'Starting the camera…'
          : camera.state === 'failed'
            ? camera.message
            : status}
      </p>
      <div class="actions scan-actions">
        {camera.state === 'on' ? (
          <button type="button" onClick={stop}>
            Stop camera
          </button>
        ) : (
          <button
            type="button"
            class="primary"
            onClick={() => void start()}
            disabled={camera.state === 'starting'}
          >
            Start camera
          </button>
        )}
        {camera.state === 'on' && camera.torch ? (
          <button type="button" aria-pressed={torchOn} onClick={() => void toggleTorch()}>
            {torchOn ? 'Torch off' : 'Torch on'}
          </button>
        ) : null}
        <label class="button file-button">
          Read a photo of the tag
          <input
            type="file"
            accept="image/*"
            disabled={busy}
            onChange={(e) => {
              const input = e.target as HTMLInputElement;
              void fromPhoto(input.files?.[0]);
              input.value = '';
            }}
          />
        </label>
      </div>
      <form
        class="typed-tag"
        onSubmit={(e) => {
          e.preventDefault();
          stop();
          void handle(typed, 'typed');
        }}
      >
        <label for="typed-tag">Or type the tag</label>
        <div class="typed-row">
          <input
            id="typed-tag"
            type="text"
            value={typed}
            autoComplete="off"
            autoCapitalize="characters"
            spellcheck={false}
            onInput={(e) => setTyped((e.target as HTMLInputElement).value)}
          />
          <button type="submit">Find tag</button>
        </div>
      </form>
      {error ? (
        <p role="alert" class="banner banner-bad">
          ⚠ {error}
        </p>
      ) : null}
      {result ? <ResultPanel result={result} busy={busy} act={act} /> : null}
    </section>
  );
}

const symbolName: Record<string, string> = {
  qr: 'QR code',
  dataMatrix: 'Data Matrix code',
  code128: 'Code 128 barcode',
  code39: 'Code 39 barcode',
};

function ResultPanel({
  result,
  busy,
  act,
}: {
  readonly result: TagResolution;
  readonly busy: boolean;
  readonly act: (work: () => Promise<string>) => Promise<void>;
}) {
  if (result.kind === 'invalid') {
    return (
      <p role="alert" class="banner banner-bad tag-result">
        ⚠ {result.message}
      </p>
    );
  }
  const { tag, via, outcome, seams } = result;
  const label = (id: string) => seams.get(id)?.seam.label ?? id;
  const link = (seamId: string, confirmedFrom?: string) => () =>
    act(async () => {
      await (await getStore()).linkTag(seamId, tag, via, confirmedFrom);
      return seamId;
    });
  switch (outcome.kind) {
    case 'open':
      return null;
    case 'unknown':
      return (
        <section class="panel tag-result" aria-labelledby="tag-result-title">
          <h2 id="tag-result-title">New tag</h2>
          <p>
            The tag <TagText tag={tag} /> is not linked to any seam on this tablet.
          </p>
          <div class="actions">
            {outcome.currentSeamId !== null ? (
              <button
                type="button"
                class="primary"
                disabled={busy}
                onClick={() => void link(outcome.currentSeamId ?? '')()}
              >
                Add this tag to {label(outcome.currentSeamId)}
              </button>
            ) : null}
            <button
              type="button"
              disabled={busy}
              onClick={() => {
                setPendingTag(tag, via);
                navigate({ name: 'seamNew' });
              }}
            >
              New seam with this tag
            </button>
          </div>
          {outcome.currentSeamId === null ? (
            <p class="note">To add the tag to a seam you have, open that seam and scan from there.</p>
          ) : null}
        </section>
      );
    case 'linkedElsewhere':
      return (
        <section class="panel tag-result tag-conflict" role="alert" aria-labelledby="tag-result-title">
          <h2 id="tag-result-title">This tag belongs to another seam</h2>
          <p>
            The tag <TagText tag={tag} /> is linked to <strong>{label(outcome.ownerSeamId)}</strong>, not to
            the current seam <strong>{label(outcome.currentSeamId)}</strong>. Nothing has been changed.
          </p>
          <div class="actions">
            <a class="button primary" href={hrefOf({ name: 'seam', id: outcome.ownerSeamId })}>
              Open {label(outcome.ownerSeamId)}
            </a>
            <button
              type="button"
              disabled={busy}
              onClick={() => void link(outcome.currentSeamId, outcome.ownerSeamId)()}
            >
              Move the tag from {label(outcome.ownerSeamId)} to {label(outcome.currentSeamId)}
            </button>
          </div>
        </section>
      );
    case 'ambiguous':
      return (
        <section class="panel tag-result" aria-labelledby="tag-result-title">
          <h2 id="tag-result-title">Several seams list this tag</h2>
          <p>
            The set-ups of these seams all list <TagText tag={tag} />. Open the right one; scanning from there
            links the tag to it.
          </p>
          <ul>
            {outcome.seamIds.map((id) => (
              <li key={id}>
                <a href={hrefOf({ name: 'seam', id })}>{label(id)}</a>
              </li>
            ))}
          </ul>
        </section>
      );
  }
}
