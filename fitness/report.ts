/**
 * The analysis as one plain JSON document (snake_case keys, null for a statistic that does not
 * exist). This is the `rivalplate fitness --json` output; README "Fitness from a CSV" lists it.
 */
import type { Analysis, Comparison, LineTrajectory } from './analysis.ts';
import type { AnovaRow, BlockedComparison } from './blocks.ts';
import type { Adjusted, LabComparisons } from './lab-comparisons.ts';
import type { FTest, SharedCurveTest } from './nested-models.ts';
import type { ReplicatesPlan } from './planning.ts';
import type { Anova, Summary, TTest } from './replicate-stats.ts';
import type { CurveFit, ModelFailure, NullFit, StepFit } from './trajectories.ts';

const summaryFields = (prefix: string, s: Summary, test: TTest | null, mu0: number) => ({
  [`mean_${prefix}`]: s.mean,
  [`sd_${prefix}`]: s.sd,
  [`se_${prefix}`]: s.se,
  [`ci_${prefix}`]: s.ci,
  [`t_${prefix}_vs_${mu0}`]: test?.t ?? null,
  [`df_${prefix}_vs_${mu0}`]: test?.df ?? null,
  [`p_${prefix}_vs_${mu0}`]: test?.p ?? null,
});

function testJson(test: TTest | Anova | null) {
  if (test === null) return null;
  if ('f' in test) {
    return {
      F: test.f,
      df_between: test.dfBetween,
      df_within: test.dfWithin,
      p: test.p,
      ss_between: test.ssBetween,
      ss_within: test.ssWithin,
    };
  }
  return { t: test.t, df: test.df, p: test.p };
}

const adjustedJson = (x: Adjusted) => ({
  t: x.test?.t ?? null,
  df: x.test?.df ?? null,
  p: x.test?.p ?? null,
  p_holm: x.pHolm,
  p_BH: x.pBH,
});

const anovaRowJson = (r: AnovaRow) => ({ df: r.df, ss: r.ss, ms: r.ms, F: r.f, p: r.p });

function blockedJson(b: BlockedComparison | null) {
  if (b === null) return null;
  return {
    blocks: b.blocks,
    anova:
      'reason' in b.anova
        ? { fitted: false, reason: b.anova.reason }
        : {
            fitted: true,
            block: anovaRowJson(b.anova.block),
            line: anovaRowJson(b.anova.line),
            residual: b.anova.residual,
          },
    mixed_model:
      'reason' in b.mixed
        ? { fitted: false, reason: b.mixed.reason }
        : {
            fitted: true,
            fixed_effects: b.mixed.fixed.map((f) => ({
              term: f.name,
              estimate: f.estimate,
              se: f.se,
              df: f.df,
              t: f.t,
              p: f.p,
            })),
            sd_block: b.mixed.sdBlock,
            sd_residual: b.mixed.sdResidual,
          },
  };
}

function comparisonsJson(c: LabComparisons) {
  return {
    by_generation: c.byGeneration.map((g) => ({
      generation: g.generation,
      lines: g.lines.map((l) => ({ line: l.line, n: l.n, mean_W: l.meanW })),
      anova: testJson(g.anova),
      welch_anova: g.welch && {
        F: g.welch.f,
        df_between: g.welch.dfBetween,
        df_within: g.welch.dfWithin,
        p: g.welch.p,
      },
      tukey_hsd:
        g.tukey?.map((t) => ({
          pair: `${t.first}-${t.second}`,
          diff: t.diff,
          lwr: t.ci[0],
          upr: t.ci[1],
          p_adjusted: t.pAdjusted,
        })) ?? null,
      blocked: blockedJson(g.blocked),
    })),
    vs_ancestor: c.vsAncestor.map((x) => ({
      line: x.line,
      generation: x.generation,
      n: x.n,
      mean_W: x.meanW,
      ci: x.ci,
      ...adjustedJson(x),
    })),
    changes: c.changes.map((x) => ({
      line: x.line,
      from: x.from,
      to: x.to,
      diff_W: x.diff,
      ci: x.ci,
      ...adjustedJson(x),
    })),
  };
}

function planJson(p: ReplicatesPlan | null) {
  if (p === null) return null;
  return {
    n: p.n,
    sd_per_assay: p.sdPerAssay,
    between_assay_sd: p.betweenAssaySd,
    counting_se: p.countingSe,
  };
}

function comparisonJson(c: Comparison | null) {
  if (c === null) return null;
  return { groups: c.groups, test: c.test, W: testJson(c.W), r: testJson(c.r) };
}

const fTestJson = (t: FTest | null) => t && { F: t.f, df_between: t.df1, df_within: t.df2, p: t.p };

function sharedCurveJson(s: SharedCurveTest | ModelFailure) {
  if ('reason' in s) return { model: s.model.replace('-', '_'), tested: false, reason: s.reason };
  return {
    model: s.model.replace('-', '_'),
    tested: true,
    lines: s.lines,
    rss_shared: s.shared.rss,
    rss_separate: s.rssSeparate,
    shared_parameters: Object.fromEntries(s.shared.parameters.map((p) => [p.name, p.estimate])),
    test: fTestJson(s.test),
  };
}

function fitJson(m: NullFit | CurveFit | StepFit | ModelFailure) {
  if ('reason' in m) return { fitted: false, reason: m.reason };
  const common = {
    fitted: true,
    n: m.n,
    k: m.k,
    rss: m.rss,
    residual_se: m.residualSe,
    log_lik: m.logLik,
    AIC: m.aic,
    AICc: m.aicc,
    BIC: m.bic,
    residuals: m.residuals,
  };
  if (m.model === 'null') return common;
  if (m.model === 'step') {
    return {
      ...common,
      change_points: m.changePoints,
      steps: m.steps,
      segments: m.segments,
      bic_by_change_points: m.bicByChangePoints.map((b) => ({
        change_points: b.changePoints,
        BIC: b.bic,
      })),
    };
  }
  return {
    ...common,
    formula: m.formula,
    converged: m.converged,
    parameters: Object.fromEntries(m.parameters.map((p) => [p.name, p.estimate])),
    standard_errors: Object.fromEntries(m.parameters.map((p) => [p.name, p.se])),
    confidence_intervals: Object.fromEntries(m.parameters.map((p) => [p.name, p.ci])),
    poorly_determined: m.parameters.filter((p) => p.poorlyDetermined).map((p) => p.name),
  };
}

function trajectoryJson(t: LineTrajectory) {
  return {
    line: t.line,
    points: t.points,
    models: {
      null: fitJson(t.null),
      hyperbolic: fitJson(t.hyperbolic),
      power_law: fitJson(t.powerLaw),
      step: fitJson(t.step),
    },
    vs_null: {
      hyperbolic: fTestJson(t.vsNull.hyperbolic),
      power_law: fTestJson(t.vsNull.powerLaw),
    },
    bands: { hyperbolic: t.bands.hyperbolic, power_law: t.bands.powerLaw },
    ranking: t.ranking.map((r) => ({
      model: r.model.replace('-', '_'),
      AIC: r.aic,
      AICc: r.aicc,
      BIC: r.bic,
      delta_AIC: r.deltaAic,
      delta_BIC: r.deltaBic,
    })),
  };
}

export function analysisJson(analysis: Analysis) {
  return {
    assays: analysis.assays.map((a) => ({
      assay: a.assay,
      group: a.group,
      line: a.line,
      generation: a.generation,
      replicate: a.replicate,
      ...(a.testMarker ? { test_marker: a.testMarker } : {}),
      ...(a.block ? { block: a.block } : {}),
      W: a.W,
      bound: a.bound,
      r: a.r,
      r_per_day: a.rPerDay,
      m_test: a.mTest,
      m_ref: a.mRef,
      s_per_generation: a.sPerGeneration,
      generations_ref: a.generationsRef,
      D: a.D,
      days: a.days,
      W_ci: a.W_ci,
      se_counting: {
        W: a.countingSe.W,
        r: a.countingSe.r,
        r_per_day: a.countingSe.rPerDay,
        s_per_generation: a.countingSe.sPerGeneration,
        m_test: a.countingSe.mTest,
        m_ref: a.countingSe.mRef,
      },
      densities: Object.fromEntries(
        (['start', 'end'] as const).map((s) => [
          s,
          {
            test_cfu_per_ml: a[s].test.cfuPerMl,
            test_ci95: a[s].test.ci95,
            reference_cfu_per_ml: a[s].reference.cfuPerMl,
            reference_ci95: a[s].reference.ci95,
            test_colonies: a[s].test.colonies,
            reference_colonies: a[s].reference.colonies,
            plates: a[s].plates,
          },
        ]),
      ),
      ...(a.uncorrected ? { uncorrected: a.uncorrected } : {}),
      flags: a.flags,
    })),
    errors: analysis.errors,
    left_out: analysis.leftOut,
    groups: analysis.groups.map((g) => ({
      group: g.group,
      n: g.W.n,
      bounded: g.bounded,
      dropped: g.dropped,
      ...summaryFields('W', g.W, g.W_vs_1, 1),
      ...summaryFields('r', g.r, g.r_vs_0, 0),
      ...(g.replicatesNeeded !== undefined
        ? { replicates_needed: planJson(g.replicatesNeeded) }
        : {}),
    })),
    marker_effect: analysis.markerEffect && {
      group: analysis.markerEffect.group,
      n: analysis.markerEffect.n,
      applied: analysis.markerEffect.applied,
      ...summaryFields('W', analysis.markerEffect.W, analysis.markerEffect.W_vs_1, 1),
      ...summaryFields('r', analysis.markerEffect.r, analysis.markerEffect.r_vs_0, 0),
    },
    reciprocal: analysis.reciprocal.map((r) => ({
      line: r.line,
      generation: r.generation,
      by_marker: r.byMarker.map((m) => ({
        marker: m.marker,
        n: m.n,
        mean_W: m.meanW,
        mean_r: m.meanR,
      })),
      mean_W: r.meanW,
      mean_r: r.meanR,
    })),
    comparison: comparisonJson(analysis.comparison),
    comparisons: comparisonsJson(analysis.comparisons),
    trajectories: analysis.trajectories.map(trajectoryJson),
    shared_curves: analysis.sharedCurves.map(sharedCurveJson),
    ...(analysis.pooledReplicatesNeeded !== undefined
      ? { replicates_needed_pooled: planJson(analysis.pooledReplicatesNeeded) }
      : {}),
  };
}

/** Throws if a number anywhere in the document is NaN or ±Infinity (JSON would turn it to null). */
export function assertAllFinite(value: unknown, path = '$'): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`non-finite number at ${path}: ${value}`);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => {
      assertAllFinite(v, `${path}[${i}]`);
    });
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) assertAllFinite(v, `${path}.${k}`);
  }
}
