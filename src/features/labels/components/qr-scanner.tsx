// Camera QR scanning: the browser's own barcode detector where it has one, zxing (fetched then) where it does not.
import { useEffect, useRef, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { Spinner } from '../../../components/ui/spinner';
import { startNativeCamera, type CameraRun } from '../lib/camera-run';
import { chooseQrEngine } from '../lib/qr-engine';

type CameraState =
  | { kind: 'starting' }
  | { kind: 'scanning' }
  | { kind: 'stopped' }
  | { kind: 'unsupported' }
  | { kind: 'denied' }
  | { kind: 'no-camera' }
  | { kind: 'busy' }
  | { kind: 'failed'; message: string };

function stateOf(error: unknown): CameraState {
  const name = (error as { name?: string } | null)?.name;
  if (name === 'NotAllowedError' || name === 'SecurityError') return { kind: 'denied' };
  if (name === 'NotFoundError' || name === 'OverconstrainedError' || name === 'DevicesNotFoundError')
    return { kind: 'no-camera' };
  if (name === 'NotReadableError' || name === 'TrackStartError') return { kind: 'busy' };
  return { kind: 'failed', message: (error as Error)?.message || 'The camera could not be started.' };
}

const cameraAvailable = () => typeof navigator !== 'undefined' && !!navigator.mediaDevices?.getUserMedia;

/** Reads QR codes from the camera and reports each new text once; the back camera first, any other on request. */
export function QrScanner({ onCode }: { onCode: (text: string) => void }) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const onCodeRef = useRef(onCode);
  onCodeRef.current = onCode;
  const lastRef = useRef<{ text: string; at: number } | null>(null);
  const [state, setState] = useState<CameraState>(cameraAvailable() ? { kind: 'starting' } : { kind: 'unsupported' });
  const [devices, setDevices] = useState<MediaDeviceInfo[]>([]);
  const [deviceId, setDeviceId] = useState<string | undefined>(undefined);
  const [enabled, setEnabled] = useState(true);
  const [run, setRun] = useState(0);
  // The browser's detector threw instead of reading: zxing from then on.
  const [nativeBroken, setNativeBroken] = useState(false);
  // The camera run being shut down. Stopping a run empties the shared <video>, so a new run starts only after the
  // previous one has stopped; otherwise a late stop blanks the new run's picture and nothing is ever decoded.
  const stoppingRef = useRef<Promise<unknown>>(Promise.resolve());

  useEffect(() => {
    if (!cameraAvailable()) return;
    if (!enabled) {
      setState({ kind: 'stopped' });
      return;
    }
    let cancelled = false;
    setState({ kind: 'starting' });
    const constraints: MediaStreamConstraints = {
      video: deviceId ? { deviceId: { exact: deviceId } } : { facingMode: { ideal: 'environment' } },
      audio: false,
    };
    const onText = (text: string) => {
      const last = lastRef.current;
      // The same label stays in view for many frames; report it once (again only after a pause).
      if (last && last.text === text && Date.now() - last.at < 3000) return;
      lastRef.current = { text, at: Date.now() };
      onCodeRef.current(text);
    };
    const start = async (): Promise<CameraRun | null> => {
      await stoppingRef.current;
      const engine = nativeBroken ? ({ kind: 'zxing' } as const) : await chooseQrEngine();
      const video = videoRef.current;
      if (cancelled || !video) return null;
      if (engine.kind === 'native') {
        return startNativeCamera(constraints, video, engine.detector, onText, () => {
          if (!cancelled) setNativeBroken(true);
        });
      }
      const { startZxingCamera } = await import('../lib/zxing-camera');
      return cancelled ? null : startZxingCamera(constraints, video, onText);
    };
    const started = start();
    started
      .then(async (camera) => {
        if (cancelled || !camera) return;
        setState({ kind: 'scanning' });
        // Camera names are only readable once permission is granted.
        const found = (await navigator.mediaDevices.enumerateDevices()).filter((d) => d.kind === 'videoinput');
        if (!cancelled) setDevices(found);
      })
      .catch((error: unknown) => {
        if (!cancelled) setState(stateOf(error));
      });
    return () => {
      cancelled = true;
      stoppingRef.current = started.then((camera) => camera?.stop()).catch(() => undefined);
    };
  }, [enabled, deviceId, run, nativeBroken]);

  const message = {
    unsupported: {
      title: 'This browser cannot use the camera here',
      body: 'Camera scanning needs a secure (https) connection and a browser with camera access. Type the container number below instead.',
    },
    denied: {
      title: 'Camera permission was refused',
      body: 'Allow camera access for Tightloop in the browser’s site settings, then try again — or type the container number below.',
    },
    'no-camera': {
      title: 'No camera found',
      body: 'This device has no camera Tightloop can use. Type the container number below.',
    },
    busy: { title: 'The camera is in use', body: 'Another app is using the camera. Close it and try again.' },
  } as const;
  const problem = state.kind in message ? message[state.kind as keyof typeof message] : null;

  return (
    <div className="flex flex-col gap-3">
      <div className="relative aspect-[4/3] w-full overflow-hidden rounded-lg bg-ink-950">
        <video ref={videoRef} muted playsInline className="size-full object-cover" aria-label="Camera view" />
        {state.kind === 'scanning' && (
          <div
            aria-hidden="true"
            className="pointer-events-none absolute inset-[12%] rounded-lg border-4 border-lime-400/90"
          />
        )}
        {(state.kind === 'starting' || problem || state.kind === 'stopped' || state.kind === 'failed') && (
          <div className="absolute inset-0 flex flex-col items-center justify-center gap-3 p-6 text-center text-white">
            {state.kind === 'starting' && (
              <>
                <Spinner className="size-8" />
                <p className="text-lg font-semibold">Starting the camera…</p>
              </>
            )}
            {state.kind === 'stopped' && <p className="text-lg font-semibold">Camera off</p>}
          </div>
        )}
      </div>
      <p className="sr-only" aria-live="polite">
        {state.kind === 'scanning' ? 'Camera on. Hold the label inside the frame.' : ''}
      </p>
      {state.kind === 'scanning' && (
        <p className="text-base text-ink-700">Hold the label inside the frame, about a hand’s width away.</p>
      )}
      {problem && (
        <Alert tone="heed" title={problem.title}>
          {problem.body}
        </Alert>
      )}
      {state.kind === 'failed' && (
        <Alert tone="alarm" title="The camera could not be started">
          {state.message}
        </Alert>
      )}
      <div className="flex flex-wrap items-end gap-3">
        {devices.length > 1 && (
          <SelectField
            label="Camera"
            className="min-w-56 flex-1"
            value={deviceId ?? ''}
            onChange={(e) => setDeviceId(e.target.value || undefined)}
          >
            <option value="">Back camera (default)</option>
            {devices.map((d, i) => (
              <option key={d.deviceId || i} value={d.deviceId}>
                {d.label || `Camera ${i + 1}`}
              </option>
            ))}
          </SelectField>
        )}
        {state.kind === 'scanning' || state.kind === 'starting' ? (
          <Button variant="secondary" onClick={() => setEnabled(false)}>
            Turn camera off
          </Button>
        ) : state.kind !== 'unsupported' && state.kind !== 'no-camera' ? (
          <Button
            variant="secondary"
            onClick={() => {
              setEnabled(true);
              setRun((n) => n + 1);
            }}
          >
            {state.kind === 'stopped' ? 'Turn camera on' : 'Try the camera again'}
          </Button>
        ) : null}
      </div>
    </div>
  );
}
