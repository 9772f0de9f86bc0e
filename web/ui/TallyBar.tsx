import type { ReactNode } from 'react';
import type { ClassIndex } from '../../schema/records.ts';
import type { ClassLook } from '../bench/colours.ts';
import { sameTool, type Tool, toolHint } from '../review/tool.ts';

export interface TallyBarProps {
  looks: [ClassLook, ClassLook];
  counts: [number, number];
  testClass: ClassIndex;
  tool: Tool;
  onTool: (t: Tool) => void;
  canUndo: boolean;
  onUndo: () => void;
  /** The plate's actions (mark checked, the next plate, the unsure colonies). */
  children: ReactNode;
}

/**
 * Kept at the screen's foot, for a thumb: the counts per colour as the person taps, one row of
 * tools (looking is the default; adding is a tool one picks), and the plate's actions.
 */
export function TallyBar(p: TallyBarProps) {
  const toolButton = (t: Tool, label: ReactNode, testId: string, name: string) => (
    <button
      type="button"
      className="btn"
      data-testid={testId}
      aria-label={name}
      title={name}
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
      <div className="counts num" data-testid="tally">
        {p.looks.map((l, i) => (
          <span key={l.name} data-testid={`count-${i}`}>
            <span className="dot" style={{ background: l.hex }} /> {l.name}{' '}
            <span data-testid={`count-${i}-value`}>{p.counts[i as ClassIndex]}</span>
            <span className="muted"> {p.testClass === i ? 'test' : 'ref'}</span>
          </span>
        ))}
      </div>
      <div className="toolbar" role="toolbar" aria-label="Tools">
        {toolButton({ kind: 'look' }, 'Look', 'tool-look', 'Look')}
        {toolButton({ kind: 'add', cls: 0 }, addLabel(0), 'tool-add-0', `Add ${p.looks[0].name}`)}
        {toolButton({ kind: 'add', cls: 1 }, addLabel(1), 'tool-add-1', `Add ${p.looks[1].name}`)}
        {toolButton({ kind: 'remove' }, '✕', 'tool-remove', 'Remove')}
        {toolButton({ kind: 'switch' }, '⇄', 'tool-switch', 'Switch colour')}
        <button
          type="button"
          className="btn quiet"
          onClick={p.onUndo}
          disabled={!p.canUndo}
          data-testid="undo"
          aria-label="Undo"
          title="Undo"
        >
          ↶
        </button>
      </div>
      {p.children}
      <p className="muted hint">{toolHint(p.tool, [p.looks[0].name, p.looks[1].name])}</p>
    </div>
  );
}
