import { useEffect, useState } from 'react';

/**
 * An action that takes two taps: the first arms it (and says what will go, or what the person
 * vouches for), the second, within a few seconds, does it. No dialog to dismiss with gloves on.
 */
export function ConfirmButton({
  label,
  armed,
  onConfirm,
  className = 'btn danger',
  testId,
  disabled,
}: {
  label: string;
  armed: string;
  onConfirm: () => void;
  className?: string;
  testId?: string;
  disabled?: boolean;
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
      className={className}
      data-testid={testId}
      disabled={disabled}
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
