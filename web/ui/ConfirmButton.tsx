import { useEffect, useState } from 'react';

/**
 * A destructive action that takes two taps: the first arms it (and says what will go), the
 * second, within a few seconds, does it. No dialog to dismiss with gloves on.
 */
export function ConfirmButton({
  label,
  armed,
  onConfirm,
}: {
  label: string;
  armed: string;
  onConfirm: () => void;
}) {
  const [isArmed, setArmed] = useState(false);
  useEffect(() => {
    if (!isArmed) return;
    const t = setTimeout(() => setArmed(false), 4000);
    return () => clearTimeout(t);
  }, [isArmed]);
  return (
    <button
      type="button"
      className="btn danger"
      onClick={() => {
        if (!isArmed) return setArmed(true);
        setArmed(false);
        onConfirm();
      }}
    >
      {isArmed ? armed : label}
    </button>
  );
}
