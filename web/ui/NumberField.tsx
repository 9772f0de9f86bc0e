import { useEffect, useState } from 'react';
import { parseFold } from '../../fitness/fold-text.ts';

/**
 * A number typed on a phone keypad. Accepts "1e5", "10^5", "100000" and "1:100000" for folds;
 * reports null while the text is not a positive number, and says so under the field.
 */
export function NumberField({
  label,
  value,
  onChange,
  whole = false,
  optional = false,
}: {
  label: string;
  value: number | null;
  onChange: (v: number | null) => void;
  whole?: boolean;
  /** Empty is allowed (null) and not marked as an error. */
  optional?: boolean;
}) {
  const [text, setText] = useState(value === null ? '' : String(value));
  useEffect(() => {
    setText((t) => (parseFold(t, whole) === value ? t : value === null ? '' : String(value)));
  }, [value, whole]);
  const parsed = parseFold(text, whole);
  const bad = parsed === null && !(optional && text.trim() === '');
  return (
    <label className="field">
      {label}
      <input
        inputMode="decimal"
        value={text}
        aria-invalid={bad}
        onChange={(e) => {
          setText(e.target.value);
          onChange(parseFold(e.target.value, whole));
        }}
      />
      {bad && <span className="field-error">{whole ? 'a whole number' : 'a number above 0'}</span>}
    </label>
  );
}
