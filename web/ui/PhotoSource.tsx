import { useState } from 'react';
import { LiveCamera } from './LiveCamera.tsx';

/** The three ways to bring a plate photo in: the phone's camera app, the live view, or a file. */
export function PhotoSource({ onPhoto }: { onPhoto: (blob: Blob, name: string) => void }) {
  const [live, setLive] = useState(false);
  const pick = (e: React.ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    e.target.value = '';
    if (file) onPhoto(file, file.name);
  };
  if (live)
    return (
      <LiveCamera
        onCapture={(blob) => {
          setLive(false);
          onPhoto(blob, `camera-${new Date().toISOString().replace(/[:.]/g, '-')}.jpg`);
        }}
        onClose={() => setLive(false)}
      />
    );
  return (
    <section className="card stack" aria-label="Add a photo">
      <p className="muted">
        Lid on, plate flat, the whole dish in the frame. Even light without reflections of the lamp
        helps most. Keep the phone out of the contaminated area, and follow your institution's
        biosafety rules.
      </p>
      <div className="grid3">
        <label className="btn primary">
          Camera
          <input
            type="file"
            accept="image/*"
            capture="environment"
            hidden
            onChange={pick}
            data-testid="camera-input"
          />
        </label>
        <button type="button" className="btn" onClick={() => setLive(true)}>
          Live view
        </button>
        <label className="btn">
          From photos
          <input
            type="file"
            accept="image/jpeg,image/png,image/webp"
            hidden
            onChange={pick}
            data-testid="file-input"
          />
        </label>
      </div>
    </section>
  );
}
