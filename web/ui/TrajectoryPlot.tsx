import type { Ref } from 'react';
import type { AnalysedAssay, BandPoint, LineTrajectory } from '../../fitness/analysis.ts';
import { type CurveFit, curveAt, type ModelFailure } from '../../fitness/trajectories.ts';
import { niceTicks } from '../results/axis.ts';
import { MODEL_NAMES, modelDoubt } from '../results/model-trust.ts';

const W = 360;
const H = 240;
const M = { left: 46, right: 10, top: 12, bottom: 40 };

/**
 * Points along a fitted curve from generation 0 to the last measured one; none for a model that
 * must not be read as a result (too few generations, a failed fit, a poorly determined parameter).
 */
const CURVE_POINTS = 64;
function curvePoints(
  t: LineTrajectory,
  fit: CurveFit | ModelFailure,
  gMax: number,
): { g: number; w: number }[] {
  if ('reason' in fit || modelDoubt(t, fit)) return [];
  const w = curveAt(fit);
  return Array.from({ length: CURVE_POINTS + 1 }, (_, i) => {
    const g = (gMax * i) / CURVE_POINTS;
    return { g, w: w(g) };
  });
}

/**
 * Relative fitness of one line over generations: each assay with its counting-noise interval
 * (an assay whose W is only a bound as an open triangle pointing the way the true W lies), the
 * fitted hyperbolic and power-law curves with their 95 % bands, and the step model.
 */
export function TrajectoryPlot({
  trajectory,
  assays,
  svgRef,
}: {
  trajectory: LineTrajectory;
  assays: readonly AnalysedAssay[];
  /** The drawn SVG element, for saving the plot as a file. */
  svgRef?: Ref<SVGSVGElement>;
}) {
  const own = assays.filter((a) => a.line === trajectory.line);
  const gMax = Math.max(...own.map((a) => a.generation), 1);
  const ws = own.flatMap((a) => [a.W, ...(a.W_ci ?? [])]);
  const yLo = Math.min(1, ...ws) - 0.05;
  const yHi = Math.max(1, ...ws) + 0.05;
  const x = (g: number) => M.left + (g / (gMax * 1.05)) * (W - M.left - M.right);
  const y = (w: number) => H - M.bottom - ((w - yLo) / (yHi - yLo)) * (H - M.top - M.bottom);
  const line = (pts: { g: number; w: number }[]) =>
    pts.map((p, i) => `${i ? 'L' : 'M'}${x(p.g)},${y(p.w)}`).join(' ');
  const clamp = (w: number) => Math.min(yHi, Math.max(yLo, w));
  const band = (pts: BandPoint[] | null, shown: boolean) =>
    pts && shown
      ? `${line(pts.map((p) => ({ g: p.generation, w: clamp(p.high) })))} ${line(
          [...pts].reverse().map((p) => ({ g: p.generation, w: clamp(p.low) })),
        ).replace(/^M/, 'L')} Z`
      : '';
  const step =
    'reason' in trajectory.step || modelDoubt(trajectory, trajectory.step) ? null : trajectory.step;
  const hyperbolic = curvePoints(trajectory, trajectory.hyperbolic, gMax);
  const powerLaw = curvePoints(trajectory, trajectory.powerLaw, gMax);
  // The legend names only what is drawn.
  const legend = [
    {
      name: MODEL_NAMES.hyperbolic,
      stroke: '#1f3b36',
      dash: undefined,
      shown: hyperbolic.length > 0,
    },
    { name: MODEL_NAMES['power-law'], stroke: '#c98f0c', dash: '5 3', shown: powerLaw.length > 0 },
    { name: MODEL_NAMES.step, stroke: '#a8341f', dash: undefined, shown: step !== null },
  ].filter((l) => l.shown);
  return (
    <svg
      ref={svgRef}
      xmlns="http://www.w3.org/2000/svg"
      className="plot"
      viewBox={`0 0 ${W} ${H}`}
      fontFamily="system-ui, sans-serif"
      fontSize={11}
      role="img"
      aria-label={`Relative fitness of line ${trajectory.line} over generations`}
    >
      <rect width={W} height={H} fill="#fff" />
      <line x1={M.left} x2={W - M.right} y1={y(1)} y2={y(1)} stroke="#999" strokeDasharray="3 3" />
      {niceTicks(yLo, yHi).map((v) => (
        <g key={`y${v}`}>
          <line x1={M.left - 4} x2={M.left} y1={y(v)} y2={y(v)} stroke="#333" />
          <text x={M.left - 6} y={y(v) + 4} textAnchor="end">
            {v.toFixed(2)}
          </text>
        </g>
      ))}
      {niceTicks(0, gMax * 1.05, 4).map((v) => (
        <g key={`x${v}`}>
          <line x1={x(v)} x2={x(v)} y1={H - M.bottom} y2={H - M.bottom + 4} stroke="#333" />
          <text x={x(v)} y={H - M.bottom + 15} textAnchor="middle">
            {v}
          </text>
        </g>
      ))}
      <line x1={M.left} x2={M.left} y1={M.top} y2={H - M.bottom} stroke="#333" />
      <line x1={M.left} x2={W - M.right} y1={H - M.bottom} y2={H - M.bottom} stroke="#333" />
      <text x={(W + M.left) / 2} y={H - 6} textAnchor="middle">
        Generations of evolution
      </text>
      <text
        transform={`translate(12 ${(H - M.bottom + M.top) / 2}) rotate(-90)`}
        textAnchor="middle"
      >
        Relative fitness W (vs. ancestor)
      </text>
      {step?.segments.map((s) => (
        // A segment of one generation would be a point; widen each a little so it shows.
        <line
          key={`s${s.from}`}
          x1={x(s.from) - 6}
          x2={x(s.to) + 6}
          y1={y(s.w)}
          y2={y(s.w)}
          stroke="#a8341f"
          strokeWidth={2}
          opacity={0.7}
        />
      ))}
      <path
        d={band(trajectory.bands.hyperbolic, hyperbolic.length > 0)}
        fill="#1f3b36"
        opacity={0.12}
      />
      <path
        d={band(trajectory.bands.powerLaw, powerLaw.length > 0)}
        fill="#c98f0c"
        opacity={0.12}
      />
      {hyperbolic.length > 0 && (
        <path d={line(hyperbolic)} fill="none" stroke="#1f3b36" strokeWidth={2} />
      )}
      {powerLaw.length > 0 && (
        <path
          d={line(powerLaw)}
          fill="none"
          stroke="#c98f0c"
          strokeWidth={2}
          strokeDasharray="5 3"
        />
      )}
      {own.map((a, i) => {
        const gx = x(a.generation) + ((i % 3) - 1) * 4;
        if (a.bound) {
          // ▼ the true W is at most this; ▲ at least.
          const d = a.bound === 'at-most' ? 5 : -5;
          const cy = y(a.W);
          return (
            <path
              key={a.assay}
              d={`M${gx - 4},${cy - d / 2} L${gx + 4},${cy - d / 2} L${gx},${cy + d / 2} Z`}
              fill="none"
              stroke="#2e5a52"
            >
              <title>{`assay ${a.assay}: W ${a.bound === 'at-most' ? '≤' : '≥'} ${a.W.toFixed(3)} (a strain had no colony)`}</title>
            </path>
          );
        }
        return (
          <g key={a.assay}>
            {a.W_ci && (
              <line x1={gx} x2={gx} y1={y(a.W_ci[0])} y2={y(a.W_ci[1])} stroke="#2e5a52" />
            )}
            <circle cx={gx} cy={y(a.W)} r={3.2} fill="#2e5a52" />
          </g>
        );
      })}
      <g transform={`translate(${M.left + 8} ${M.top + 6})`}>
        {legend.map((l, i) => (
          <g key={l.name} transform={`translate(${i * 84} 0)`}>
            <line
              x1={0}
              x2={16}
              y1={0}
              y2={0}
              stroke={l.stroke}
              strokeWidth={2}
              strokeDasharray={l.dash}
            />
            <text x={20} y={4}>
              {l.name}
            </text>
          </g>
        ))}
      </g>
    </svg>
  );
}
