import type { Colony, PlateAnalysis } from '../../cv/index.ts';
import { madeUpReading } from './made-up-reading.ts';

/** A colony of a made-up reading, seen through lid glare or not. */
export function colonyAt(x: number, glareLit: boolean): Colony {
  return {
    x,
    y: 10,
    r: 4,
    area: 50,
    cls: 0,
    confidence: 1,
    split: false,
    count: 1,
    lab: [40, 30, 10],
    deltaLab: [-20, 15, 5],
    ...(glareLit ? { glareLit: true as const } : {}),
  };
}

/** A made-up reading of a plate under lid glare: one red colony in the clear, one seen through it. */
export function glareReading(colonies = [colonyAt(10, false), colonyAt(30, true)]): PlateAnalysis {
  return madeUpReading(colonies, {
    counts: { red: colonies.length },
    classes: [{ cls: 0, name: 'red', hex: '#a03030', deltaLab: [-20, 15, 5] }],
    flags: [{ kind: 'glare', fraction: 0.1 }],
  });
}
