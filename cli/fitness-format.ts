/** Readable tables for `rivalplate fitness` (the --json output is fitness/report.ts). */
import type { Analysis, Comparison } from '../fitness/analysis.ts';
import type { BlockedComparison } from '../fitness/blocks.ts';
import type { Adjusted, LabComparisons } from '../fitness/lab-comparisons.ts';
import type { FTest, SharedCurveTest } from '../fitness/nested-models.ts';
import type { ReplicatesPlan } from '../fitness/planning.ts';
import type { Anova, TTest } from '../fitness/replicate-stats.ts';
import { formatForReport, type RoundingRule } from '../fitness/rounding.ts';
import type { CurveFit, ModelFailure, NullFit, StepFit } from '../fitness/trajectories.ts';

export interface TextOptions {
  /** Publication rounding of densities; 'none' prints three significant digits. */
  rounding: RoundingRule | 'none';
}

/** Left-aligned text columns, right-aligned numbers, two spaces apart. */
export function table(header: string[], rows: string[][]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const numeric = header.map(
    (_, i) => rows.length > 0 && rows.every((r) => /^[-+−\d.(]|^—$/.test(r[i] ?? '')),
  );
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (numeric[i] ? c.padStart(widths[i]!) : c.padEnd(widths[i]!)))
      .join('  ')
      .trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

const f = (x: number | null | undefined, digits = 4) =>
  x === null || x === undefined ? '—' : x.toFixed(digits);
const ci = (c: [number, number] | null) => (c ? `(${c[0].toFixed(4)}, ${c[1].toFixed(4)})` : '—');

function p(x: number | null | undefined): string {
  if (x === null || x === undefined) return '—';
  return x < 1e-4 ? '< 0.0001' : x.toFixed(4);
}

const pEq = (x: number) => (x < 1e-4 ? 'p < 0.0001' : `p = ${x.toFixed(4)}`);
const dfText = (df: number) => (Number.isInteger(df) ? String(df) : df.toFixed(1));

function density(x: number, options: TextOptions): string {
  return options.rounding === 'none' ? x.toPrecision(3) : formatForReport(x, options.rounding);
}

function testText(test: TTest | Anova | null): string {
  if (test === null) return 'not computable (too few assays or no spread)';
  if ('f' in test)
    return `F(${test.dfBetween}, ${test.dfWithin}) = ${test.f.toFixed(3)}, ${pEq(test.p)}`;
  return `t(${dfText(test.df)}) = ${test.t.toFixed(3)}, ${pEq(test.p)}`;
}

function comparisonText(c: Comparison): string {
  const name = c.test === 'welch' ? "Welch's two-sample t-test" : 'one-way ANOVA';
  const groups = c.groups.length > 6 ? `${c.groups.length} groups` : c.groups.join(', ');
  return [`${name} across ${groups}`, `  W: ${testText(c.W)}`, `  r: ${testText(c.r)}`].join('\n');
}

const adjustedCells = (x: Adjusted) =>
  x.test
    ? [x.test.t.toFixed(3), dfText(x.test.df), p(x.test.p), p(x.pHolm), p(x.pBH)]
    : ['no test (one assay or no spread)', '', '', '', ''];

function blockedText(generation: number, b: BlockedComparison): string[] {
  const out = [
    '',
    `Generation ${generation} in blocks (${b.blocks.join(', ')})`,
    '  Read the aov when every line ran in every block and these blocks are the ones of interest;',
    '  the mixed model when blocks stand for days in general or some lines miss some blocks.',
  ];
  if ('reason' in b.anova) out.push(`  aov(W ~ block + line): not computable: ${b.anova.reason}`);
  else {
    const a = b.anova;
    out.push(
      table(
        ['  aov(W ~ block + line)', 'df', 'SS', 'MS', 'F', 'p'],
        [
          [
            '  block',
            String(a.block.df),
            f(a.block.ss, 6),
            f(a.block.ms, 6),
            f(a.block.f, 3),
            p(a.block.p),
          ],
          [
            '  line',
            String(a.line.df),
            f(a.line.ss, 6),
            f(a.line.ms, 6),
            f(a.line.f, 3),
            p(a.line.p),
          ],
          ['  residual', String(a.residual.df), f(a.residual.ss, 6), f(a.residual.ms, 6), '', ''],
        ],
      ),
    );
  }
  if ('reason' in b.mixed) out.push(`  mixed model (REML): not fitted: ${b.mixed.reason}`);
  else {
    const m = b.mixed;
    out.push(
      `  mixed model W ~ line + (1 | block), REML: SD between blocks ${m.sdBlock.toFixed(4)}, within ${m.sdResidual.toFixed(4)}`,
    );
    out.push(
      table(
        ['  effect', 'estimate', 'SE', 'df', 't', 'p'],
        m.fixed.map((x) => [
          `  ${x.name}`,
          f(x.estimate),
          f(x.se),
          String(x.df),
          x.t.toFixed(3),
          p(x.p),
        ]),
      ),
    );
  }
  return out;
}

function comparisonsText(c: LabComparisons, corrected: boolean): string[] {
  const out: string[] = [];
  if (c.byGeneration.length > 0) {
    out.push('', 'Lines compared within each generation (W)');
    out.push(
      table(
        ['gen', 'lines (n)', 'ANOVA', 'SS between', 'SS within', "Welch's ANOVA"],
        c.byGeneration.map((g) => [
          String(g.generation),
          g.lines.map((l) => `${l.line} (${l.n})`).join(', '),
          testText(g.anova),
          f(g.anova?.ssBetween, 6),
          f(g.anova?.ssWithin, 6),
          g.welch
            ? `F(${g.welch.dfBetween}, ${dfText(g.welch.dfWithin)}) = ${g.welch.f.toFixed(3)}, ${pEq(g.welch.p)}`
            : 'not computable (a line with one assay or no spread)',
        ]),
      ),
    );
    const pairs = c.byGeneration.flatMap((g) =>
      (g.tukey ?? []).map((t) => [
        String(g.generation),
        `${t.first} − ${t.second}`,
        f(t.diff),
        ci(t.ci),
        p(t.pAdjusted),
      ]),
    );
    if (pairs.length > 0) {
      out.push('', "Tukey's HSD, every pair of lines at one generation (95% family-wise)");
      out.push(table(['gen', 'pair', 'diff W', '95% CI', 'p adj'], pairs));
    }
  }
  for (const g of c.byGeneration) if (g.blocked) out.push(...blockedText(g.generation, g.blocked));
  if (c.vsAncestor.length > 0) {
    out.push(
      '',
      corrected
        ? "Each line against the ancestor (W = 1), with the controls' uncertainty (delta method, Welch–Satterthwaite df); Holm and Benjamini–Hochberg over all of them"
        : 'Each line against the ancestor (W = 1), one-sample t-tests; Holm and Benjamini–Hochberg over all of them',
    );
    out.push(
      table(
        ['line', 'gen', 'n', 'mean W', '95% CI', 't', 'df', 'p', 'p Holm', 'p BH'],
        c.vsAncestor.map((x) => [
          x.line,
          String(x.generation),
          String(x.n),
          f(x.meanW),
          ci(x.ci),
          ...adjustedCells(x),
        ]),
      ),
    );
  }
  if (c.changes.length > 0) {
    out.push(
      '',
      corrected
        ? "Each line's change between measured generations, Welch t-tests; intervals with the controls' uncertainty (delta method); Holm and Benjamini–Hochberg over all of them"
        : "Each line's change between measured generations, Welch t-tests; Holm and Benjamini–Hochberg over all of them",
    );
    out.push(
      table(
        ['line', 'from', 'to', 'diff W', '95% CI', 't', 'df', 'p', 'p Holm', 'p BH'],
        c.changes.map((x) => [
          x.line,
          String(x.from),
          String(x.to),
          f(x.diff),
          ci(x.ci),
          ...adjustedCells(x),
        ]),
      ),
    );
  }
  return out;
}

const fText = (t: FTest | null) =>
  t ? `F(${t.df1}, ${t.df2}) = ${t.f.toFixed(3)}, ${pEq(t.p)}` : 'no test';

function sharedText(s: SharedCurveTest | ModelFailure): string {
  if ('reason' in s) return `  ${s.model}: not tested: ${s.reason}`;
  return `  ${s.model}: one curve for ${s.lines.join(', ')} against one per line: ${fText(s.test)} (RSS ${s.shared.rss.toPrecision(4)} vs ${s.rssSeparate.toPrecision(4)})`;
}

function modelRow(m: NullFit | CurveFit | StepFit | ModelFailure, label: string): string[] {
  if ('reason' in m) return [label, `not fitted: ${m.reason}`, '', '', '', '', ''];
  let params: string;
  if (m.model === 'null') {
    params = 'none';
  } else if (m.model === 'step') {
    const heights = m.segments.map((s) => `${s.from}–${s.to}: ${s.w.toFixed(3)}`).join('; ');
    params = `${m.changePoints} change point(s); ${heights}`;
  } else {
    params = m.parameters
      .map(
        (q) =>
          `${q.name} = ${q.estimate.toPrecision(4)} ± ${q.se.toPrecision(2)} (95% ${q.ci[0].toPrecision(3)} to ${q.ci[1].toPrecision(3)})${q.poorlyDetermined ? ' poorly determined' : ''}`,
      )
      .join(', ');
    if (!m.converged) params += ' (not converged)';
  }
  return [
    label,
    params,
    m.residualSe.toFixed(4),
    f(m.aic, 2),
    m.aicc === null ? 'n too small' : f(m.aicc, 2),
    f(m.bic, 2),
    String(m.k),
  ];
}

function leftOutText(bounded: number, dropped: number): string {
  const parts = [
    ...(bounded > 0 ? [`${bounded} bounded`] : []),
    ...(dropped > 0 ? [`${dropped} not computable`] : []),
  ];
  return parts.length > 0 ? parts.join(', ') : 'none';
}

function planRow(label: string, p: ReplicatesPlan | null): string[] {
  return p
    ? [label, String(p.n), f(p.sdPerAssay), f(p.betweenAssaySd), f(p.countingSe)]
    : [label, '—', '—', '—', '—'];
}

export function analysisText(a: Analysis, options: TextOptions): string {
  const out: string[] = [];
  out.push(
    `Assays: ${a.assays.length} computed${a.errors.length ? `, ${a.errors.length} failed` : ''}`,
  );
  out.push(
    table(
      [
        'assay',
        'group',
        'gen',
        'W',
        'W 95% CI (counting)',
        'r',
        'r/day',
        's/gen',
        'start test/ref CFU/mL',
        'flags',
      ],
      a.assays.map((x) => [
        x.assay,
        x.group,
        String(x.generation),
        x.bound ? `${x.bound === 'at-most' ? '≤' : '≥'} ${f(x.W)}` : f(x.W),
        ci(x.W_ci),
        f(x.r),
        f(x.rPerDay),
        f(x.sPerGeneration),
        `${density(x.start.test.cfuPerMl, options)} / ${density(x.start.reference.cfuPerMl, options)}`,
        x.flags.map((g) => g.code).join(' '),
      ]),
    ),
  );
  const flagged = a.assays.filter((x) => x.flags.length > 0);
  if (flagged.length > 0) {
    out.push('', 'Flags:');
    for (const x of flagged) for (const g of x.flags) out.push(`  assay ${x.assay}: ${g.message}`);
  }
  if (a.errors.length > 0) {
    out.push('', 'Assays that could not be computed:');
    for (const e of a.errors) out.push(`  ${e.message}`);
  }
  const bounded = a.leftOut.filter((l) => l.reason === 'bounded');
  if (bounded.length > 0) {
    out.push(
      '',
      'Assays whose W is only a bound (a strain had no colony), left out of means and tests:',
    );
    for (const l of bounded) out.push(`  assay ${l.assay} (${l.group}): ${l.message}`);
  }
  out.push(
    '',
    'Groups (mean of replicate assays, 95% CI from Student t, two-sided one-sample t-tests)',
  );
  out.push(
    table(
      [
        'group',
        'n',
        'left out',
        'mean W',
        'SD',
        'SE',
        '95% CI',
        'p (W=1)',
        'mean r',
        'SD r',
        'p (r=0)',
      ],
      a.groups.map((g) => [
        g.group,
        String(g.W.n),
        leftOutText(g.bounded, g.dropped),
        f(g.W.mean),
        f(g.W.sd),
        f(g.W.se),
        ci(g.W.ci),
        p(g.W_vs_1?.p),
        f(g.r.mean),
        f(g.r.sd),
        p(g.r_vs_0?.p),
      ]),
    ),
  );
  const planned = a.groups.filter((g) => g.replicatesNeeded !== undefined);
  if (planned.length > 0) {
    out.push(
      '',
      'Replicate assays needed per group to detect the --detect difference in W from another group',
      '(two-sided Welch-type design, α = 0.05, 80% power, same colony numbers as these assays)',
    );
    out.push(
      table(
        ['group', 'n needed', 'SD per assay', 'between-assay SD', 'counting SE'],
        [
          ...planned.map((g) => planRow(g.group, g.replicatesNeeded ?? null)),
          planRow('all but controls (pooled SD)', a.pooledReplicatesNeeded ?? null),
        ],
      ),
    );
  }
  if (a.markerEffect) {
    const m = a.markerEffect;
    out.push(
      '',
      `Marker effect (group ${m.group}, n = ${m.n}): mean W ${f(m.W.mean)} ${ci(m.W.ci)}, W = 1: ${testText(m.W_vs_1)}; mean r ${f(m.r.mean)}, r = 0: ${testText(m.r_vs_0)}`,
      m.applied
        ? "  The other assays are corrected by it (W divided by its mean W, r minus its mean r); group intervals and tests carry the controls' uncertainty (delta method for W, Welch for r)."
        : '  Not applied to the other assays (use --correct-marker).',
    );
  }
  if (a.reciprocal.length > 0) {
    out.push('', 'Reciprocal pairs (mean per marker, then the average of the marker means)');
    out.push(
      table(
        ['line', 'gen', 'by marker', 'mean W', 'mean r'],
        a.reciprocal.map((r) => [
          r.line,
          String(r.generation),
          r.byMarker.map((m) => `${m.marker}: ${m.meanW.toFixed(4)} (n=${m.n})`).join('; '),
          f(r.meanW),
          f(r.meanR),
        ]),
      ),
    );
  }
  out.push(...comparisonsText(a.comparisons, Boolean(a.markerEffect?.applied)));
  if (a.comparison) out.push('', comparisonText(a.comparison));
  for (const t of a.trajectories) {
    out.push('', `Trajectory of ${t.line} (${t.points.length} assays; w against generations)`);
    out.push(
      table(
        ['model', 'parameters ± SE (Wald 95% interval)', 'resid SE', 'AIC', 'AICc', 'BIC', 'k'],
        [
          modelRow(t.null, 'null        w = 1'),
          modelRow(t.hyperbolic, 'hyperbolic  w = 1 + a·t/(t + b)'),
          modelRow(t.powerLaw, 'power law   w = (b·t + 1)^a'),
          modelRow(t.step, 'step        piecewise constant'),
        ],
      ),
    );
    const best = t.ranking[0];
    if (best) {
      const next = t.ranking[1];
      out.push(
        `  lowest AIC: ${best.model}${next ? ` (next: ${next.model}, ΔAIC ${next.deltaAic.toFixed(2)})` : ''}`,
      );
    }
    out.push(
      `  against w = 1 (extra sum of squares): hyperbolic ${fText(t.vsNull.hyperbolic)}; power law ${fText(t.vsNull.powerLaw)}`,
    );
  }
  if (a.sharedCurves.length > 0) {
    out.push('', 'Do the lines share one curve? (extra-sum-of-squares F test)');
    for (const sc of a.sharedCurves) out.push(sharedText(sc));
  }
  return `${out.join('\n')}\n`;
}
