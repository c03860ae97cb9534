/**
 * The groupings of a curve's peaks into dot levels that the model fit compares: the rule-based
 * assignment, the regimes forced on the same peaks, and charging ladders of an s doublet and a
 * p shell (whole, 2+4 or 2+2+2) read in filling order or from the empty dot.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import { assignSpectrum } from "../../assign/assignSpectrum.ts";
import { SCENARIO_DEFAULTS, stateCount } from "../scenario.ts";
import { levelsToFit, seedKey, type LevelSeed } from "./levelsToFit.ts";
import { resonanceSuspects } from "./resonanceSuspects.ts";
import { resonanceLevels } from "./resonanceLevels.ts";
import type { heldValenceLevels } from "./heldValenceLevels.ts";

/** How a hypothesis reads its peaks. */
export type HypothesisKind = "assigned" | "shell-filling" | "shell-tunneling" | "ladder-filling" | "ladder-empty";

/** One grouping of the peaks into levels that the fit tries. */
export interface FitHypothesis {
  /** Short name: "assigned", "shell-filling", "shell-tunneling", or "ladder-filling 2+2+4" etc. */
  name: string;
  kind: HypothesisKind;
  /** In words, for the evidence. */
  label: string;
  /** The analysis whose settings and peak width start the fit (with the grouping's assignment). */
  analysis: CurveAnalysis;
  seeds: LevelSeed[];
  /**
   * Readings of the VB peaks to try with these CB levels when the whole curve is fitted (the
   * first is the one in `seeds`): the filling rules' groups, and runs spaced by Ec entered from
   * the empty dot.
   */
  vbReadings: LevelSeed[][];
  /** Degeneracies of the CB levels, in order (e.g. [2, 2, 4] for s and a 2+4 p shell). */
  cbDegeneracies: number[];
  /** Charge states of its larger band's master equation, Π(g_j + 1) (the cost of one model evaluation grows with it). */
  states: number;
  /** Starting Ec in eV read from the peaks, or null to take the analysis' (or the guess). */
  chargingEnergyStartEV: number | null;
  /** log₁₀ Γtip/Γsub of the first start, or null for the analysis' regime's default. */
  rateRatioStartLog10: number | null;
  /**
   * VB levels held in the model but not fitted (a CB-side hypothesis: the VB levels whose steps
   * through the substrate junction fall on the CB side, {@link heldValenceLevels}), each at the
   * energy its first peak gives with the current Ec. Default: none.
   */
  heldVb?: LevelSeed[];
}

/** Constants of {@link fitHypotheses} (locked by test/model/fit/fitHypotheses.test.ts). */
export const FIT_HYPOTHESES_DEFAULTS = Object.freeze({
  /** CB layouts after s (g = 2): p whole, p split 2+4, p split 2+2+2. */
  pLayouts: Object.freeze([Object.freeze([6]), Object.freeze([2, 4]), Object.freeze([2, 2, 2])]) as readonly (readonly number[])[],
  /**
   * Most charge states per band of a compared hypothesis (Π(g_j + 1) over its levels): larger
   * master equations make the comparison slow and are not tried.
   */
  maxStatesPerBand: 100,
  /** log₁₀ Γtip/Γsub of the first start of a ladder read in filling order (r = 5) … */
  fillingStartLog10: Math.log10(5),
  /** … and of one read from the empty dot (r = 0.5, the crossover). */
  emptyStartLog10: Math.log10(0.5),
  /** Electrons in s with which the first p peak seen is read as entered, in the empty-dot readings. */
  emptyEntryElectrons: Object.freeze([0, 1]) as readonly number[],
  /**
   * A peak within this fraction of Ec/η of a charging peak already explained by a lower level
   * (its ladder ε + Ec·(n + ½)) is taken as that charging peak, not as a new level.
   */
  ladderTolerance: 0.25,
  /**
   * Peaks whose step is below this fraction of their band's median step are left out of the
   * ladders' reading (lower than the rules' noise limit: near the crossover the second charging
   * peak of a level is weak but real).
   */
  ladderNoiseRatio: 0.05,
  /**
   * Whether the ladders are also read with the CB peaks the VB peaks predict as their
   * second-junction resonances set aside ({@link resonanceSuspects}, note 7; chosen on the low-η
   * accuracy benchmark with the comparison).
   */
  resonanceFamily: true,
  /**
   * Whether the ladders are also read with the CB resonances the rules labelled nearest the gap
   * read as charging peaks as well ({@link resonanceLevels}, note 8; chosen on the low-η accuracy
   * benchmark with the comparison).
   */
  resonanceLevelFamily: true,
});

/**
 * The hypotheses the fit compares for one analysis.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis: peaks (bias in V, steps in A), assignment, η.
 * eta : number
 *     Voltage-division factor η used by the fit.
 * all : boolean
 *     false: the assignment only; true: every hypothesis below.
 *
 * Returns
 * -------
 * FitHypothesis[]
 *     The assignment first, then the others; groupings with the same levels are kept once; none
 *     whose master equation would exceed SCENARIO_DEFAULTS.maxStates per band (but note 6).
 *
 * Throws
 * ------
 * Nothing (an analysis without levels gives an empty list).
 *
 * Notes
 * -----
 * With D = FIT_HYPOTHESES_DEFAULTS and P the CB peaks (positive bias, second-junction resonances
 * and steps below D.ladderNoiseRatio × the band's median set aside, ascending):
 * 1. "assigned": the rules' own grouping ({@link levelsToFit}).
 * 2. "shell-filling", "shell-tunneling": the regimes forced on the same peaks.
 * 3. "ladder-filling s+p": the CB peaks are charging peaks in filling order; level j (degeneracy
 *    g_j of the layout [2, …p layout]) starts at P[Σ_{i<j} g_i], ε_j = η·V − Ec·(N_before + ½),
 *    Ec₀ = η·(P₁ − P₀), P here the charging peaks the filling rules kept; levels whose first
 *    peak is past the window are left out (the window cuts the shell). VB: the filling rules'
 *    groups.
 * 4. "ladder-empty s+p": s holds two electrons (P₁ its second charging peak, Ec₀ = η·(P₁ − P₀)),
 *    and each further level is entered from the empty dot: its first peak is the first peak not
 *    within D.ladderTolerance·Ec₀/η of a charging peak of a lower level (ε_k + Ec₀·(n + ½), n up
 *    to the electrons below and in it); ε = η·V − Ec₀/2, and a second reading with the first
 *    p peak entered with one electron in s (D.emptyEntryElectrons). VB: runs of peaks spaced by Ec₀/η, one
 *    level each, holding the run's length less the holes of the levels nearer the gap. This is
 *    how a spectrum at an intermediate rate ratio reads.
 * 5. Layouts: p whole, 2+4, 2+2+2 (D.pLayouts); no d shell (peaks past p stay unexplained and
 *    cost χ²). Hypotheses with more than D.maxStatesPerBand charge states in a band are not tried.
 * 6. Unless none would be tried otherwise: then those within it on the CB side are, their VB
 *    left to the whole-curve fit (it fits the readings within the limit, else the VB read as a
 *    shell). Admitted always, they won over the right grouping on some intermediate spectra (a
 *    ladder from the empty dot with the filling order's VB reading, poor but below the restarts'
 *    threshold), so only where the assignment would otherwise be fitted alone, or not at all.
 * 7. At low η a VB peak at V_v < 0 has its substrate-junction resonance at η·|V_v|/(1 − η) > 0,
 *    among the CB peaks; where the rules did not label it, a ladder may take it for a level and
 *    fit well with a wrong Ec or Γtip/Γsub. When some CB peaks lie there
 *    ({@link resonanceSuspects}), steps 3 and 4 are read again without them (names ending
 *    "off-resonance"; D.resonanceFamily), and the two readings compete by BIC. A reading that
 *    finds fewer CB levels of its layout without them than with them is not added (the window
 *    then seems to cut the shell, and a shorter ladder fits the side's few peaks as well with a
 *    wrong Ec). At the usual η the mirrors lie beyond the window and nothing is added.
 * 8. The reverse: a level's charging peak within a FWHM of a VB peak's resonance merges with it
 *    into one peak, which the rules label the resonance alone (s then seems to have one peak, or
 *    takes its second from p). The labelled resonances among the CB peaks nearest the gap
 *    ({@link resonanceLevels}) are put back and steps 3 and 4 read again with them, in filling
 *    order over every CB peak (the filling rules' charging peaks lack the merged one; names
 *    ending "on-resonance"; D.resonanceLevelFamily). The merged peak lies between the charging
 *    peak and the resonance, so Ec₀ is read from the VB's first two peaks (η × their spacing, the
 *    first VB level's charging doublet in filling order) rather than from s's. The model holds
 *    the VB level's resonance either way, so the readings with and without the peak as a charging
 *    peak compete by BIC.
 *
 * Example
 * -------
 * ```ts
 * // analysis of the fitCurve example at Γtip/Γsub = 0.5 (rules: undetermined).
 * fitHypotheses(analysis, 0.85, true).map((h) => h.name);
 * // => ["assigned", "shell-filling", "shell-tunneling", "ladder-filling 2+6", …, "ladder-empty 2+2+2+2"]
 * ```
 */
export function fitHypotheses(analysis: CurveAnalysis, eta: number, all: boolean): FitHypothesis[] {
  const D = FIT_HYPOTHESES_DEFAULTS;
  const out: FitHypothesis[] = [];
  const seen = new Set<string>();
  const limit = Math.min(SCENARIO_DEFAULTS.maxStates, D.maxStatesPerBand);
  // Groupings within the limit on the CB side whose own VB reading is beyond it (note 6).
  const beyond: FitHypothesis[] = [];
  const add = (h: Omit<FitHypothesis, "cbDegeneracies" | "states" | "vbReadings">, vbReadings?: LevelSeed[][]) => {
    const key = seedKey(h.seeds) + `|${h.chargingEnergyStartEV ?? ""}`;
    if (!h.seeds.some((s) => s.band === "CB") && h.kind !== "assigned") return;
    if (!h.seeds.length || seen.has(key)) return;
    const own = h.seeds.filter((s) => s.band === "VB");
    const readings = [own, ...(vbReadings ?? []).filter((r) => seedKey(r) !== seedKey(own))];
    const cbStates = stateCount(h.seeds.filter((x) => x.band === "CB"));
    const states = Math.max(cbStates, stateCount(own));
    if (h.kind !== "assigned" && cbStates > limit) return;
    seen.add(key);
    const hypothesis = { ...h, vbReadings: readings, cbDegeneracies: h.seeds.filter((s) => s.band === "CB").map((s) => s.degeneracy), states };
    (h.kind !== "assigned" && states > limit ? beyond : out).push(hypothesis);
  };
  const done = () => (out.some((h) => h.kind !== "assigned") ? out : [...out, ...beyond]);
  const base = { chargingEnergyStartEV: null, rateRatioStartLog10: null };
  add({ name: "assigned", kind: "assigned", label: "the assignment's grouping", analysis, seeds: levelsToFit(analysis), ...base });
  if (!all) return done();

  const etaOption = analysis.assignment.energies.etaGiven ? { eta } : {};
  const forced = (regime: "shell-filling" | "shell-tunneling"): CurveAnalysis => ({ ...analysis, assignment: assignSpectrum(analysis.peaks, { ...etaOption, regime }) });
  const filling = forced("shell-filling");
  const tunneling = forced("shell-tunneling");
  if (analysis.assignment.regime !== "shell-filling") add({ name: "shell-filling", kind: "shell-filling", label: "the shell-filling grouping of the same peaks", analysis: filling, seeds: levelsToFit(filling), ...base });
  if (analysis.assignment.regime !== "shell-tunneling") add({ name: "shell-tunneling", kind: "shell-tunneling", label: "the shell-tunnelling grouping (single levels) of the same peaks", analysis: tunneling, seeds: levelsToFit(tunneling), ...base });

  const peaksV = ladderPeaksV(analysis, "CB");
  if (peaksV.length < 2) return done();
  // In filling order, the charging peaks the filling rules kept (peaks off the ladder set aside).
  const chargingPeaksV = filling.assignment.multiplets.filter((m) => m.band === "CB").flatMap((m) => m.peaksV).sort((a, b) => a - b);
  const vbFilling = levelsToFit(filling).filter((s) => s.band === "VB");
  const vbPeaksV = ladderPeaksV(analysis, "VB");
  // CB levels of each layout's reading with every peak (an off-resonance reading must keep as many, note 7).
  const levelsRead = new Map<string, number>();
  const ladders = (peaksV: readonly number[], chargingPeaksV: readonly number[], suffix: string, ecStartEV?: number) => {
    const fewer = (key: string, n: number) => (suffix ? n < (levelsRead.get(key) ?? 0) : (levelsRead.set(key, n), false));
    const ec0 = ecStartEV ?? eta * (peaksV[1] - peaksV[0]);
    const vbEmpty = valenceLadderSeeds(vbPeaksV, ec0 / eta, D.ladderTolerance);
    for (const pLayout of D.pLayouts) {
      const layout = [2, ...pLayout];
      const words = pLayout.length === 1 ? "p whole" : `p split ${pLayout.join("+")}`;
      const inOrder = fillingOrderSeeds(chargingPeaksV, layout);
      if (!fewer(`filling ${layout}`, inOrder.length)) add({
        name: `ladder-filling ${inOrder.map((s) => s.degeneracy).join("+")}${suffix}`,
        kind: "ladder-filling",
        label: `charging ladder in filling order (s doublet, ${words}${inOrder.length < layout.length ? ", the window cuts the shell" : ""})`,
        analysis: filling,
        seeds: [...inOrder, ...vbFilling],
        chargingEnergyStartEV: ec0,
        rateRatioStartLog10: D.fillingStartLog10,
      }, [vbEmpty]);
      const fromEmpty = emptyDotSeeds(peaksV, layout, ec0 / eta, D.ladderTolerance);
      if (fewer(`empty ${layout}`, fromEmpty.length)) continue;
      for (const entry of D.emptyEntryElectrons) {
        // The first p peak seen may be p entered with 0 or 1 electrons in s (the entry from the
        // empty dot is weak near r ≈ 1 and may go unseen).
        const seeds = fromEmpty.map((x) => (x.label === "s" ? x : { ...x, before: entry }));
        add({
          name: `ladder-empty${entry ? `-${entry}` : ""} ${fromEmpty.map((x) => x.degeneracy).join("+")}${suffix}`,
          kind: "ladder-empty",
          label: `charging ladder read from the empty dot (s doublet, ${words}${entry ? `, the first p peak read as entered with ${entry} electron in s` : ""})`,
          analysis: filling,
          seeds: [...seeds, ...vbEmpty],
          chargingEnergyStartEV: ec0,
          rateRatioStartLog10: D.emptyStartLog10,
        }, [vbFilling]);
      }
    }
  };
  ladders(peaksV, chargingPeaksV, "");
  // The same ladders with the CB peaks the VB peaks predict as their resonances set aside (note 7).
  const suspects = D.resonanceFamily ? resonanceSuspects(analysis, eta) : new Set<number>();
  const offV = peaksV.filter((v) => !suspects.has(v));
  if (offV.length < peaksV.length && offV.length >= 2) ladders(offV, chargingPeaksV.filter((v) => !suspects.has(v)), " off-resonance");
  // The same ladders with the labelled resonances nearest the gap read as charging peaks too (note 8).
  const merged = D.resonanceLevelFamily ? resonanceLevels(analysis, eta) : [];
  const byBias = (a: number, b: number) => a - b;
  const onV = [...peaksV, ...merged].sort(byBias);
  // The merged peak lies between the charging peak and the resonance: Ec₀ from the VB's first two peaks instead.
  const vbEc = vbPeaksV.length >= 2 ? eta * Math.abs(vbPeaksV[1] - vbPeaksV[0]) : undefined;
  if (merged.length) ladders(onV, onV, " on-resonance", vbEc);
  return done();
}

/** A band's peaks that may be levels or charging peaks: no resonance, no noise-level step; from the gap outward. */
function ladderPeaksV(analysis: CurveAnalysis, band: "CB" | "VB"): number[] {
  const resonant = new Set(analysis.assignment.evidence.secondJunction.map((r) => r.index));
  const own = analysis.peaks.filter((p, i) => (band === "CB" ? p.biasV > 0 : p.biasV < 0) && !resonant.has(i));
  const steps = own.map((p) => p.stepA).sort((a, b) => a - b);
  const median = steps.length ? steps[Math.floor(steps.length / 2)] : 0;
  return own.filter((p) => p.stepA >= FIT_HYPOTHESES_DEFAULTS.ladderNoiseRatio * median).map((p) => p.biasV).sort((a, b) => Math.abs(a) - Math.abs(b));
}

/**
 * VB levels of a charging ladder entered from the empty dot: a run of peaks spaced by Ec/η
 * (within the tolerance) is one level, entered with 0, 1, … holes already in the levels nearer the
 * gap, so it holds the run's length less those holes (at least 1; VB degeneracy is not assumed).
 */
function valenceLadderSeeds(peaksV: readonly number[], ecV: number, tolerance: number): LevelSeed[] {
  const seeds: LevelSeed[] = [];
  let holes = 0;
  let run: number[] = [];
  const close = () => {
    if (!run.length) return;
    const g = Math.max(1, run.length - holes);
    seeds.push({ band: "VB", label: `v${seeds.length + 1}`, degeneracy: g, firstPeakV: run[0], before: 0 });
    holes += g;
    run = [];
  };
  for (const v of peaksV) {
    if (run.length && Math.abs(Math.abs(v - run[run.length - 1]) - ecV) > tolerance * ecV) close();
    run.push(v);
  }
  close();
  return seeds;
}

/** Levels of a layout read as charging peaks in filling order (notes step 3). */
function fillingOrderSeeds(peaksV: readonly number[], layout: readonly number[]): LevelSeed[] {
  const seeds: LevelSeed[] = [];
  let before = 0;
  layout.forEach((g, j) => {
    if (before >= peaksV.length) return;
    seeds.push({ band: "CB", label: levelLabel(layout.length, j), degeneracy: g, firstPeakV: peaksV[before], before });
    before += g;
  });
  return seeds;
}

/** Levels of a layout each entered from the empty dot (notes step 4). */
function emptyDotSeeds(peaksV: readonly number[], layout: readonly number[], ecV: number, tolerance: number): LevelSeed[] {
  const full = layout;
  const seeds: LevelSeed[] = [];
  const firsts: number[] = [];
  let electrons = 0;
  for (const v of peaksV) {
    if (seeds.length === full.length) break;
    // A charging peak of a lower level: V_k + n·Ec/η for n = 1 … (electrons so far, this level's included) − 1.
    const explained = firsts.some((f) => {
      const n = Math.round((v - f) / ecV);
      return n >= 1 && n < electrons && Math.abs(v - f - n * ecV) < tolerance * ecV;
    });
    if (explained) continue;
    const j = seeds.length;
    seeds.push({ band: "CB", label: levelLabel(layout.length, j), degeneracy: full[j], firstPeakV: v, before: 0 });
    firsts.push(v);
    electrons += full[j];
  }
  return seeds;
}

/** s, then p (or p1, p2, … when split). */
function levelLabel(layoutLength: number, j: number): string {
  if (j === 0) return "s";
  return layoutLength === 2 ? "p" : `p${j}`;
}
