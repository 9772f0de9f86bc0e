import { transfer } from 'comlink';
import { useEffect, useRef, useState } from 'react';
import { useServices } from '../app/services.ts';

/**
 * An in-app camera view with a circular guide for the dish. The frame is grabbed at the
 * camera's full resolution and encoded as a JPEG in the worker; it is then read like any other
 * photo.
 */
export function LiveCamera({
  onCapture,
  onClose,
}: {
  onCapture: (blob: Blob) => void;
  onClose: () => void;
}) {
  const video = useRef<HTMLVideoElement>(null);
  const [error, setError] = useState<string | null>(null);
  const [ready, setReady] = useState(false);
  const [busy, setBusy] = useState(false);
  const { worker } = useServices();

  useEffect(() => {
    let stream: MediaStream | null = null;
    let stopped = false;
    navigator.mediaDevices
      ?.getUserMedia({
        video: { facingMode: 'environment', width: { ideal: 4032 }, height: { ideal: 3024 } },
        audio: false,
      })
      .then((s) => {
        if (stopped) {
          for (const t of s.getTracks()) t.stop();
          return;
        }
        stream = s;
        if (video.current) {
          video.current.srcObject = s;
          void video.current.play().then(() => setReady(true));
        }
      })
      .catch((e: unknown) =>
        setError(
          `The camera is not available (${e instanceof Error ? e.message : String(e)}). Use "Camera" or "From photos" instead.`,
        ),
      );
    if (!navigator.mediaDevices)
      setError('This browser gives no camera access here (it needs https or localhost).');
    return () => {
      stopped = true;
      for (const t of stream?.getTracks() ?? []) t.stop();
    };
  }, []);

  async function capture() {
    const v = video.current;
    if (!v?.videoWidth) return;
    setBusy(true);
    try {
      const frame = await createImageBitmap(v);
      // The frame is transferred: the worker owns it from here and closes it after encoding.
      onCapture(await worker.call((api) => api.frameToJpeg(transfer(frame, [frame]))));
    } catch (e) {
      setError(`The frame could not be saved (${e instanceof Error ? e.message : String(e)}).`);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card stack" aria-label="Live camera">
      <div className="camera">
        <video ref={video} playsInline muted />
        <svg
          className="guide"
          viewBox="0 0 100 75"
          preserveAspectRatio="xMidYMid meet"
          aria-hidden="true"
        >
          <circle
            cx="50"
            cy="37.5"
            r="33"
            fill="none"
            stroke="#f0b429"
            strokeWidth="0.8"
            strokeDasharray="3 2"
          />
          <text x="50" y="73" textAnchor="middle" fontSize="3.2" fill="#fff">
            fit the dish inside the ring
          </text>
        </svg>
      </div>
      {error && <p className="field-error">{error}</p>}
      <div className="row">
        <button
          type="button"
          className="btn primary"
          onClick={() => void capture()}
          disabled={!ready || busy}
        >
          Take photo
        </button>
        <button type="button" className="btn quiet" onClick={onClose}>
          Close
        </button>
      </div>
    </section>
  );
}
