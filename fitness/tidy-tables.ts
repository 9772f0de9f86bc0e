/**
 * The analysis as tidy tables, one per kind of result, in long format: one row per assay, group,
 * test, model, parameter or curve point, one column per variable, missing values as NA and
 * logicals as TRUE/FALSE, so R's read.csv() and spreadsheets read them with no cleaning. This is
 * `rivalplate fitness --csv-dir DIR` (one file per table, `<name>.csv`); README "Tidy tables"
 * lists every column.
 */
import type { Analysis, LineTrajectory } from './analysis.ts';
import type { BlockedComparison } from './blocks.ts';
import { toCsv } from './csv-write.ts';
import type { Adjusted } from './lab-comparisons.ts';
import type { FTest } from './nested-models.ts';
import type { Summary, TTest } from './replicate-stats.ts';
import type { CurveFit, ModelFailure, NullFit, StepFit } from './trajectories.ts';

type Cell = string | number | null;

export interface TidyTable {
  name: string;
  header: string[];
  rows: Cell[][];
}

const bool = (b: boolean) => (b ? 'TRUE' : 'FALSE');

const ASSAY_COLUMNS = [
  'assay',
  'group',
  'line',
  'generation',
  'replicate',
  'block',
  'test_marker',
  'status',
  'W',
  'W_bound',
  'W_ci_low',
  'W_ci_high',
  'se_W_counting',
  'r',
  'r_per_day',
  's_per_generation',
  'm_test',
  'm_ref',
  'generations_ref',
  'D',
  'days',
  'flags',
  'message',
];

function assaysTable(a: Analysis): TidyTable {
  const rows: Cell[][] = a.assays.map((x) => [
    x.assay,
    x.group,
    x.line,
    x.generation,
    x.replicate,
    x.block ?? null,
    x.testMarker ?? null,
    x.bound ? 'bounded' : 'computed',
    x.W,
    x.bound ? x.bound.replace('-', '_') : null,
    x.W_ci?.[0] ?? null,
    x.W_ci?.[1] ?? null,
    x.countingSe.W,
    x.r,
    x.rPerDay,
    x.sPerGeneration,
    x.mTest,
    x.mRef,
    x.generationsRef,
    x.D,
    x.days,
    x.flags.map((f) => f.code).join(' '),
    x.flags.map((f) => f.message).join('; '),
  ]);
  for (const e of a.errors) {
    const row: Cell[] = ASSAY_COLUMNS.map(() => null);
    row[0] = e.assay;
    row[1] = e.group;
    row[7] = 'not_computable';
    row[ASSAY_COLUMNS.length - 1] = e.message;
    rows.push(row);
  }
  return { name: 'assays', header: ASSAY_COLUMNS, rows };
}

const summaryCells = (s: Summary, t: TTest | null): Cell[] => [
  s.mean,
  s.sd,
  s.se,
  s.ci?.[0] ?? null,
  s.ci?.[1] ?? null,
  t?.t ?? null,
  t?.df ?? null,
  t?.p ?? null,
];

function groupsTable(a: Analysis): TidyTable {
  const stats = (v: string, mu: number) =>
    ['mean', 'sd', 'se', 'ci_low', 'ci_high', `t_vs_${mu}`, `df_vs_${mu}`, `p_vs_${mu}`].map(
      (s) => `${s}_${v}`,
    );
  return {
    name: 'groups',
    header: [
      'group',
      'marker_control',
      'n',
      'bounded',
      'not_computable',
      ...stats('W', 1),
      ...stats('r', 0),
    ],
    rows: a.groups.map((g) => [
      g.group,
      bool(g.group === a.markerEffect?.group),
      g.W.n,
      g.bounded,
      g.dropped,
      ...summaryCells(g.W, g.W_vs_1),
      ...summaryCells(g.r, g.r_vs_0),
    ]),
  };
}

const COMPARISON_COLUMNS = [
  'family',
  'generation',
  'line',
  'term',
  'estimate',
  'se',
  'ci_low',
  'ci_high',
  'statistic',
  'df1',
  'df2',
  'p',
  'p_holm',
  'p_BH',
  'ss',
  'ms',
];

interface ComparisonRow {
  family: string;
  generation?: number;
  line?: string;
  term?: string;
  estimate?: number;
  se?: number;
  ci?: [number, number];
  statistic?: number;
  df1?: number;
  df2?: number;
  p?: number;
  pHolm?: number | null;
  pBH?: number | null;
  ss?: number;
  ms?: number;
}

const comparisonCells = (r: ComparisonRow): Cell[] => [
  r.family,
  r.generation ?? null,
  r.line ?? null,
  r.term ?? null,
  r.estimate ?? null,
  r.se ?? null,
  r.ci?.[0] ?? null,
  r.ci?.[1] ?? null,
  r.statistic ?? null,
  r.df1 ?? null,
  r.df2 ?? null,
  r.p ?? null,
  r.pHolm ?? null,
  r.pBH ?? null,
  r.ss ?? null,
  r.ms ?? null,
];

const tCells = (x: Adjusted) =>
  x.test ? { statistic: x.test.t, df1: x.test.df, p: x.test.p, pHolm: x.pHolm, pBH: x.pBH } : {};

function blockedRows(generation: number, b: BlockedComparison): ComparisonRow[] {
  const rows: ComparisonRow[] = [];
  if (!('reason' in b.anova)) {
    const a = b.anova;
    for (const [term, row] of [
      ['block', a.block],
      ['line', a.line],
    ] as const) {
      rows.push({
        family: 'blocked_anova',
        generation,
        term,
        statistic: row.f,
        df1: row.df,
        df2: a.residual.df,
        p: row.p,
        ss: row.ss,
        ms: row.ms,
      });
    }
    rows.push({
      family: 'blocked_anova',
      generation,
      term: 'residual',
      df1: a.residual.df,
      ss: a.residual.ss,
      ms: a.residual.ms,
    });
  }
  if (!('reason' in b.mixed)) {
    for (const x of b.mixed.fixed) {
      rows.push({
        family: 'mixed_model_fixed',
        generation,
        term: x.name,
        estimate: x.estimate,
        se: x.se,
        statistic: x.t,
        df1: x.df,
        p: x.p,
      });
    }
    rows.push({ family: 'mixed_model_sd', generation, term: 'block', estimate: b.mixed.sdBlock });
    rows.push({
      family: 'mixed_model_sd',
      generation,
      term: 'residual',
      estimate: b.mixed.sdResidual,
    });
  }
  return rows;
}

const fRow = (t: FTest) => ({ statistic: t.f, df1: t.df1, df2: t.df2, p: t.p });

function comparisonsTable(a: Analysis): TidyTable {
  const rows: ComparisonRow[] = [];
  const c = a.comparisons;
  for (const g of c.byGeneration) {
    const generation = g.generation;
    if (g.anova) {
      rows.push({
        family: 'anova_lines',
        generation,
        term: 'line',
        statistic: g.anova.f,
        df1: g.anova.dfBetween,
        df2: g.anova.dfWithin,
        p: g.anova.p,
        ss: g.anova.ssBetween,
        ms: g.anova.ssBetween / g.anova.dfBetween,
      });
      rows.push({
        family: 'anova_lines',
        generation,
        term: 'residual',
        df1: g.anova.dfWithin,
        ss: g.anova.ssWithin,
        ms: g.anova.ssWithin / g.anova.dfWithin,
      });
    }
    if (g.welch) {
      rows.push({
        family: 'welch_anova_lines',
        generation,
        term: 'line',
        statistic: g.welch.f,
        df1: g.welch.dfBetween,
        df2: g.welch.dfWithin,
        p: g.welch.p,
      });
    }
    for (const t of g.tukey ?? []) {
      rows.push({
        family: 'tukey_hsd',
        generation,
        term: `${t.first}-${t.second}`,
        estimate: t.diff,
        ci: t.ci,
        p: t.pAdjusted,
      });
    }
    if (g.blocked) rows.push(...blockedRows(generation, g.blocked));
  }
  for (const x of c.vsAncestor) {
    rows.push({
      family: 'line_vs_ancestor',
      generation: x.generation,
      line: x.line,
      term: 'W - 1',
      estimate: x.meanW - 1,
      ...(x.ci ? { ci: [x.ci[0] - 1, x.ci[1] - 1] as [number, number] } : {}),
      ...tCells(x),
    });
  }
  for (const x of c.changes) {
    rows.push({
      family: 'line_change',
      generation: x.to,
      line: x.line,
      term: `${x.to}-${x.from}`,
      estimate: x.diff,
      ...(x.ci ? { ci: x.ci } : {}),
      ...tCells(x),
    });
  }
  for (const s of a.sharedCurves) {
    if ('reason' in s || !s.test) continue;
    rows.push({ family: 'shared_curve', term: s.model, ...fRow(s.test) });
  }
  return { name: 'comparisons', header: COMPARISON_COLUMNS, rows: rows.map(comparisonCells) };
}

type AnyFit = NullFit | CurveFit | StepFit | ModelFailure;

function fits(t: LineTrajectory): [string, AnyFit, FTest | null][] {
  return [
    ['null', t.null, null],
    ['hyperbolic', t.hyperbolic, t.vsNull.hyperbolic],
    ['power_law', t.powerLaw, t.vsNull.powerLaw],
    ['step', t.step, null],
  ];
}

function modelsTable(a: Analysis): TidyTable {
  const rows: Cell[][] = [];
  for (const t of a.trajectories) {
    for (const [model, m, vs] of fits(t)) {
      if ('reason' in m) {
        rows.push([t.line, model, 'FALSE', m.reason, ...new Array<null>(13).fill(null)]);
        continue;
      }
      const rank = t.ranking.find((r) => r.model === m.model);
      rows.push([
        t.line,
        model,
        'TRUE',
        null,
        m.n,
        m.k,
        m.rss,
        m.residualSe,
        m.logLik,
        m.aic,
        m.aicc,
        m.bic,
        rank?.deltaAic ?? null,
        vs?.f ?? null,
        vs?.df1 ?? null,
        vs?.df2 ?? null,
        vs?.p ?? null,
      ]);
    }
  }
  return {
    name: 'models',
    header: [
      'line',
      'model',
      'fitted',
      'reason',
      'n',
      'k',
      'rss',
      'residual_se',
      'log_lik',
      'AIC',
      'AICc',
      'BIC',
      'delta_AIC',
      'F_vs_null',
      'df1_vs_null',
      'df2_vs_null',
      'p_vs_null',
    ],
    rows,
  };
}

function parametersTable(a: Analysis): TidyTable {
  const rows: Cell[][] = [];
  for (const t of a.trajectories) {
    for (const [model, m] of fits(t)) {
      if ('reason' in m || m.model === 'null') continue;
      if (m.model === 'step') {
        for (const s of m.segments) {
          rows.push([t.line, model, `w_${s.from}_${s.to}`, s.w, s.se, null, null, null]);
        }
        continue;
      }
      for (const q of m.parameters) {
        rows.push([
          t.line,
          model,
          q.name,
          q.estimate,
          q.se,
          q.ci[0],
          q.ci[1],
          bool(q.poorlyDetermined),
        ]);
      }
    }
  }
  return {
    name: 'model_parameters',
    header: [
      'line',
      'model',
      'parameter',
      'estimate',
      'se',
      'ci_low',
      'ci_high',
      'poorly_determined',
    ],
    rows,
  };
}

function curvePointsTable(a: Analysis): TidyTable {
  const rows: Cell[][] = [];
  for (const t of a.trajectories) {
    for (const [model, band] of [
      ['hyperbolic', t.bands.hyperbolic],
      ['power_law', t.bands.powerLaw],
    ] as const) {
      for (const b of band ?? []) rows.push([t.line, model, b.generation, b.w, b.low, b.high]);
    }
  }
  return {
    name: 'curve_points',
    header: ['line', 'model', 'generation', 'w', 'band_low', 'band_high'],
    rows,
  };
}

export function tidyTables(a: Analysis): TidyTable[] {
  return [
    assaysTable(a),
    groupsTable(a),
    comparisonsTable(a),
    modelsTable(a),
    parametersTable(a),
    curvePointsTable(a),
  ];
}

/** A table as CSV text: NA for missing values. */
export function tidyCsv(table: TidyTable): string {
  return toCsv(table.header, table.rows, 'NA');
}
