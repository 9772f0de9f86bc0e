import { useState } from 'react';

const SEEN_KEY = 'rivalplate.biosafety-note-seen';

/** The biosafety note, shown once on this device until the person acknowledges it. */
export function SafetyNote() {
  const [seen, setSeen] = useState(() => localStorage.getItem(SEEN_KEY) === '1');
  if (seen) return null;
  return (
    <div className="sheet-backdrop">
      <section className="sheet" role="dialog" aria-modal="true" aria-labelledby="safety-title">
        <h2 id="safety-title">Before you photograph plates</h2>
        <ul>
          <li>Photograph plates with the lid on.</li>
          <li>
            Keep the phone out of contaminated work areas, or use a cover you can disinfect and wipe
            it as you do other bench equipment.
          </li>
          <li>
            Your institution's biosafety rules and your lab's risk assessment come first; Rivalplate
            changes nothing about them.
          </li>
        </ul>
        <button
          type="button"
          className="btn primary"
          onClick={() => {
            localStorage.setItem(SEEN_KEY, '1');
            setSeen(true);
          }}
        >
          Understood
        </button>
      </section>
    </div>
  );
}
