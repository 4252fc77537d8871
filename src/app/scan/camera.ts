// The rear camera: started with facingMode "environment" as an ideal, not exact, so a tablet with one camera (or
// a test's fake device) still gives a picture; the torch is offered only when the track says it has one.

export type CameraFailure = { readonly ok: false; readonly message: string };
export type CameraStart = { readonly ok: true; readonly stream: MediaStream } | CameraFailure;

export async function startRearCamera(): Promise<CameraStart> {
  if (!window.isSecureContext || !navigator.mediaDevices?.getUserMedia) {
    return {
      ok: false,
      message:
        'The camera works only when the app is opened over https (or on localhost). Use a photo of the tag or type it.',
    };
  }
  try {
    const stream = await navigator.mediaDevices.getUserMedia({
      audio: false,
      video: { facingMode: { ideal: 'environment' }, width: { ideal: 1280 }, height: { ideal: 720 } },
    });
    return { ok: true, stream };
  } catch (e) {
    const name = e instanceof Error ? e.name : '';
    const message =
      name === 'NotAllowedError'
        ? 'The camera was not allowed. Allow it for this site in the browser settings, or use a photo or type the tag.'
        : name === 'NotFoundError' || name === 'OverconstrainedError'
          ? 'No camera was found on this device. Use a photo of the tag or type it.'
          : name === 'NotReadableError'
            ? 'The camera is in use by another app. Close it and try again, or use a photo or type the tag.'
            : `The camera could not be started (${name || String(e)}). Use a photo of the tag or type it.`;
    return { ok: false, message };
  }
}

export function stopCamera(stream: MediaStream | null): void {
  for (const track of stream?.getTracks() ?? []) track.stop();
}

type TorchCapabilities = MediaTrackCapabilities & { torch?: boolean };

/** The video track when it has a torch the page may switch. */
export function torchTrack(stream: MediaStream): MediaStreamTrack | null {
  const [track] = stream.getVideoTracks();
  const caps = track?.getCapabilities?.() as TorchCapabilities | undefined;
  return track && caps?.torch ? track : null;
}

export async function setTorch(track: MediaStreamTrack, on: boolean): Promise<void> {
  await track.applyConstraints({ advanced: [{ torch: on } as MediaTrackConstraintSet] });
}
