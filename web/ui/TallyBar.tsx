import type { ReactNode } from 'react';
import { countableStatus, DEFAULT_COUNTABLE_RANGE } from '../../fitness/countable-range.ts';
import type { ClassIndex } from '../../schema/records.ts';
import type { ClassLook } from '../bench/colours.ts';
import { sameTool, type Tool, toolHint } from '../review/tool.ts';

export interface TallyBarProps {
  looks: [ClassLook, ClassLook];
  counts: [number, number];
  /** What the analysis found before any correction. */
  found: [number, number];
  testClass: ClassIndex;
  tool: Tool;
  onTool: (t: Tool) => void;
  canUndo: boolean;
  canRedo: boolean;
  onUndo: () => void;
  onRedo: () => void;
  /** Extra actions of the plate (mark checked, re-read, save picture). */
  children: ReactNode;
}

/** The counts per colour as the person taps, the tools, and undo/redo: kept at the screen's foot. */
export function TallyBar(p: TallyBarProps) {
  const status = countableStatus(p.counts[0] + p.counts[1], DEFAULT_COUNTABLE_RANGE);
  const toolButton = (t: Tool, label: ReactNode, testId: string) => (
    <button
      type="button"
      className="btn"
      data-testid={testId}
      aria-pressed={sameTool(p.tool, t)}
      onClick={() => p.onTool(t)}
    >
      {label}
    </button>
  );
  const addLabel = (i: ClassIndex) => (
    <>
      + <span className="dot" style={{ background: p.looks[i].hex }} />
    </>
  );
  return (
    <div className="tally">
      <div className="muted" data-testid="range">
        {p.counts[0] + p.counts[1]} colonies ·{' '}
        {status === 'countable' ? (
          `within ${DEFAULT_COUNTABLE_RANGE.source}`
        ) : (
          <span className="flag">
            {status === 'too-few' ? 'too few' : 'too many'} to count (
            {DEFAULT_COUNTABLE_RANGE.source})
          </span>
        )}{' '}
        · the analysis found {p.found[0]} + {p.found[1]}
        {p.found[0] === p.counts[0] && p.found[1] === p.counts[1]
          ? ''
          : `, now ${p.counts[0]} + ${p.counts[1]}`}{' '}
        · broken rings: colour uncertain; dashed: added by hand
      </div>
      <div className="counts num" data-testid="tally">
        {p.looks.map((l, i) => (
          <span key={l.name} data-testid={`count-${i}`}>
            <span className="dot" style={{ background: l.hex }} /> {l.name}{' '}
            <span data-testid={`count-${i}-value`}>{p.counts[i as ClassIndex]}</span>
            <span className="muted"> {p.testClass === i ? 'test' : 'ref'}</span>
          </span>
        ))}
      </div>
      <div className="toolbar">
        {toolButton({ kind: 'add', cls: 0 }, addLabel(0), 'tool-add-0')}
        {toolButton({ kind: 'add', cls: 1 }, addLabel(1), 'tool-add-1')}
        {toolButton({ kind: 'remove' }, 'Remove', 'tool-remove')}
        {toolButton({ kind: 'switch' }, 'Switch', 'tool-switch')}
        <button
          type="button"
          className="btn quiet"
          onClick={p.onUndo}
          disabled={!p.canUndo}
          data-testid="undo"
        >
          Undo
        </button>
      </div>
      <div className="row">
        <button
          type="button"
          className="btn quiet"
          onClick={p.onRedo}
          disabled={!p.canRedo}
          data-testid="redo"
        >
          Redo
        </button>
        {p.children}
        {toolButton({ kind: 'teach', first: null }, 'Teach colours', 'tool-teach')}
      </div>
      <p className="muted" style={{ margin: 0 }}>
        {toolHint(p.tool)} Pinch to zoom; drag the dish's handles to move it.
      </p>
    </div>
  );
}
