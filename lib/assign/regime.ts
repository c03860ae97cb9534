/**
 * The regime of a spectrum (shell filling, shell tunnelling or undetermined) from its first
 * conduction-band peaks, with the numbers that decided it.
 */
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { BandPeak } from "./bandPeaks.ts";
import { tunnelingShells } from "./shells.ts";
import type { SecondJunctionResonance } from "./secondJunction.ts";
import { levelStepRatio, rateRatioFromStepRatio } from "../model/regimeLimits.ts";

/** Shell filling (Γtip ≫ Γsub: charging multiplets), shell tunnelling (Γtip ≪ Γsub: one peak per level), or neither. */
export type Regime = "shell-filling" | "shell-tunneling" | "undetermined";

/** Why the regime was chosen: the numbers the rules looked at. */
export interface RegimeEvidence {
  /** Step of the second CB peak over the first (areas); null with fewer than two CB peaks. */
  secondToFirstStepRatio: number | null;
  /** Spacing from CB peak 2 to the next peak that is not its weak satellite, over that of peaks 1–2; null without one. */
  thirdToSecondSpacingRatio: number | null;
  /** Step of the second VB main peak over the first; null with fewer than two VB main peaks. */
  valenceStepRatio: number | null;
  /** Spacing of the first two VB main peaks over that of the first two CB peaks; null without both pairs. */
  valenceSpacingRatio: number | null;
  /**
   * Step of the VB peak (a main peak or a charging satellite) one CB pair's spacing beyond the VB
   * edge peak over the edge peak's step (see {@link regimeRatios}, note 4); null without such a peak.
   */
  valenceTwinStepRatio: number | null;
  /** CB peaks taken as charging satellites (weak peaks after a main peak) in shell tunnelling. */
  satellitePeaksV: number[];
  /**
   * Indices (into the peak list given to `assignSpectrum`) of the peaks in `satellitePeaksV`, in
   * the same order.
   */
  satellitePeakIndices: number[];
  /**
   * Peaks set aside as resonances through the dot–substrate junction (opposite bias, at
   * −η·V/(1 − η) of a tip-junction peak V); empty when η was not given.
   */
  secondJunction: SecondJunctionResonance[];
  /** The rules that decided, in words. */
  reasons: string[];
}

/** The ratios of {@link regimeRatios}: the numeric part of {@link RegimeEvidence}. */
export type RegimeRatios = Pick<RegimeEvidence, "secondToFirstStepRatio" | "thirdToSecondSpacingRatio" | "valenceStepRatio" | "valenceSpacingRatio" | "valenceTwinStepRatio">;

/**
 * The ratios the regime rules read, from the CB peaks left after the noise rule and the VB main
 * peaks.
 *
 * Parameters
 * ----------
 * cb : readonly BandPeak[]
 *     CB peaks from the gap edge outward, noise set aside.
 * vb : readonly BandPeak[], optional
 *     VB main peaks (noise and charging satellites set aside) from the gap edge outward.
 *     Default: none (the VB ratios are then null).
 * vbAll : readonly BandPeak[], optional
 *     VB peaks with noise set aside but charging satellites kept, from the gap edge outward.
 *     Default: `vb`.
 *
 * Returns
 * -------
 * RegimeRatios
 *     See {@link RegimeEvidence}; all dimensionless.
 *
 * Notes
 * -----
 * 1. Step ratio = stepA of peak 2 / stepA of peak 1 (null with fewer than two peaks).
 * 2. The third peak is the first after peak 2 whose step is at least
 *    `ASSIGN_DEFAULTS.satelliteStepRatioMax` × that of peak 2 (a weaker one is its satellite);
 *    spacing ratio = (x₃ − x₂)/(x₂ − x₁), null without such a peak.
 * 3. VB step ratio = stepA of VB peak 2 / stepA of VB peak 1; VB spacing ratio =
 *    (x₂ − x₁) of the VB over (x₂ − x₁) of the CB.
 * 4. VB twin step ratio: among `vbAll` past the edge peak, the one nearest |V| = x₁(VB) + (x₂ − x₁)
 *    of the CB, within ± `ASSIGN_DEFAULTS.valenceChargingTolerance` × that spacing; its step over
 *    the edge peak's (null without one). Where the first two CB peaks are s's charging doublet,
 *    the VB edge level gives one too, Ec/η apart in bias on both sides: a peak there stepping
 *    less than the edge peak (r/(1 + r) < 1) is its second charging peak.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, index: number) => ({ x, index, peak: { biasV: x, stepA } as Peak });
 * regimeRatios([at(0.6875, 1e-11, 0), at(0.8125, 0.9e-11, 1), at(1.3125, 1e-11, 2)], [at(0.8125, 1e-11, 3), at(0.9375, 1e-11, 4)]);
 * // => { secondToFirstStepRatio: 0.9, thirdToSecondSpacingRatio: 4, valenceStepRatio: 1, valenceSpacingRatio: 1, valenceTwinStepRatio: 1 }
 * ```
 */
export function regimeRatios(cb: readonly BandPeak[], vb: readonly BandPeak[] = [], vbAll: readonly BandPeak[] = vb): RegimeRatios {
  const D = ASSIGN_DEFAULTS;
  let secondToFirstStepRatio: number | null = null;
  let thirdToSecondSpacingRatio: number | null = null;
  let valenceStepRatio: number | null = null;
  let valenceSpacingRatio: number | null = null;
  if (cb.length >= 2) secondToFirstStepRatio = cb[1].peak.stepA / cb[0].peak.stepA;
  // The jump to the next peak that is not a weak satellite of the second.
  const third = cb.slice(2).find((p) => p.peak.stepA >= D.satelliteStepRatioMax * cb[1].peak.stepA);
  if (third) thirdToSecondSpacingRatio = (third.x - cb[1].x) / (cb[1].x - cb[0].x);
  if (vb.length >= 2) {
    valenceStepRatio = vb[1].peak.stepA / vb[0].peak.stepA;
    if (cb.length >= 2) valenceSpacingRatio = (vb[1].x - vb[0].x) / (cb[1].x - cb[0].x);
  }
  return { secondToFirstStepRatio, thirdToSecondSpacingRatio, valenceStepRatio, valenceSpacingRatio, valenceTwinStepRatio: valenceTwin(cb, vbAll) };
}

/** Note 4 of {@link regimeRatios}: the VB twin of the first CB pair's spacing, as a step ratio; null without one. */
function valenceTwin(cb: readonly BandPeak[], vbAll: readonly BandPeak[]): number | null {
  if (cb.length < 2 || vbAll.length < 2 || !(vbAll[0].peak.stepA > 0)) return null;
  const spacing = cb[1].x - cb[0].x;
  const want = vbAll[0].x + spacing;
  const tol = ASSIGN_DEFAULTS.valenceChargingTolerance * spacing;
  let best: BandPeak | null = null;
  for (const q of vbAll.slice(1)) if (Math.abs(q.x - want) <= tol && (!best || Math.abs(q.x - want) < Math.abs(best.x - want))) best = q;
  return best ? best.peak.stepA / vbAll[0].peak.stepA : null;
}

/**
 * Classify a spectrum from its first CB peaks.
 *
 * Parameters
 * ----------
 * cb : readonly BandPeak[]
 *     CB peaks from the gap edge outward, noise set aside.
 * main : readonly BandPeak[]
 *     The same with the charging satellites also set aside (see `splitSatellites`).
 * evidence : RegimeEvidence
 *     Holds the ratios of {@link regimeRatios}; the rules append their reasons to
 *     `evidence.reasons` (the only field written).
 *
 * Returns
 * -------
 * Regime
 *
 * Notes
 * -----
 * In shell filling the s level gives two charging peaks of similar height, the second r/(1 + r)
 * of the first for r = Γtip/Γsub; in shell tunnelling one peak, followed by a p peak two to three
 * times higher. With D = `ASSIGN_DEFAULTS`:
 * 1. Fewer than two CB peaks: undetermined.
 * 2. Step ratio within `D.fillingStepRatio` and, if a third peak exists, a jump to it of at least
 *    `D.fillingJumpRatioMin` × the first spacing: shell filling.
 * 3. Step ratio between `D.tunnelingSatelliteRatioMax` and the filling range: undetermined (an
 *    intermediate rate ratio: too strong for a satellite, too weak for a doublet) — unless the
 *    third CB peak (or the split shell it opens, see `extraCbPeak`) steps at least
 *    `D.tunnelingStepRatioMin` × the first and the second VB step
 *    at least as much × the first VB step (see `extraSecondPeak`): a level of more states follows
 *    the first on both sides, which a rate ratio in the crossover does not give (its charging
 *    peaks step alike), so the second CB peak is an extra one (at low η an unpredicted
 *    second-junction resonance) and note 4 decides, with p the shell after it (`extraCbPeak`).
 *    Alike steps with a next spacing at most `D.levelPairJumpMax` × theirs: not a doublet (its
 *    jump to p is Ec + Δsp > Ec) but the s level and a p level: shell tunnelling. The same with a
 *    step ratio below `levelStepRatio(2, 6, D.levelPairRateRatioMax)` and a next spacing at most
 *    `D.valenceLevelPairJumpMax` × theirs where the VB reads as
 *    levels (see `valenceLevels`): a resonance under s (at low η) or the noise of weak steps
 *    moves the CB ratio, and the VB's levels, whose own resonances fall at positive bias, still
 *    tell levels from a charging doublet. Alike steps
 *    (ratio at least `D.earlyEntryDoubletRatioMin`) with a shorter jump to a weak third peak that
 *    is p entered early (see `earlyEntryJump`): shell filling. Alike steps and no third CB peak: the VB decides (see `pairWithoutThird`).
 * 4. Otherwise the p shell — the second main peak with the sub-levels close to it (see
 *    `tunnelingShells`) — carrying at least `D.tunnelingStepRatioMin` × the s step: shell
 *    tunnelling. With a measured charging satellite of s (step ratio q from
 *    `D.satelliteEvidenceMin` to `D.tunnelingSatelliteRatioMax`), r = q/(1 − q) and the p shell
 *    needs only `D.levelStepMargin` × levelStepRatio(2, 2, r) = 1/(1 + 4r) (lib/model/regimeLimits.ts:
 *    at r near 3/7 a level's step is no longer its degeneracy ratio). Else undetermined.
 *
 * References
 * ----------
 * The step ratio r/(1 + r) of the s doublet follows from the stationary master equation of the
 * charging ladder (orthodox theory; see `lib/model/ladder.ts` and its references, among them
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)).
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, index: number) => ({ x, index, peak: { biasV: x, stepA } as Peak });
 * const cb = [at(0.6875, 1e-11, 0), at(0.8125, 0.9e-11, 1), at(1.3125, 1e-11, 2)];
 * const evidence = { ...regimeRatios(cb), satellitePeaksV: [], satellitePeakIndices: [], reasons: [] };
 * classifyRegime(cb, cb, evidence);  // => "shell-filling"
 * ```
 */
export function classifyRegime(cb: readonly BandPeak[], main: readonly BandPeak[], evidence: RegimeEvidence): Regime {
  const D = ASSIGN_DEFAULTS;
  const reasons = evidence.reasons;
  if (cb.length === 0) {
    reasons.push("no CB peaks");
    return "undetermined";
  }
  if (cb.length === 1) {
    reasons.push("one CB peak only: the regime cannot be told");
    return "undetermined";
  }
  const ratio = evidence.secondToFirstStepRatio!;
  const jump = evidence.thirdToSecondSpacingRatio;
  if (ratio >= D.fillingStepRatio[0] && ratio <= D.fillingStepRatio[1]) {
    if (jump === null) return pairWithoutThird(ratio, evidence);
    if (jump >= D.fillingJumpRatioMin) {
      reasons.push(
        `the first two CB steps are alike (ratio ${ratio.toFixed(2)} within ${D.fillingStepRatio.join("–")}) and the next jump is ${jump.toFixed(2)} × their spacing (≥ ${D.fillingJumpRatioMin}): an s doublet of charging peaks`,
      );
      return "shell-filling";
    }
    if (jump <= D.levelPairJumpMax && ratio >= levelStepRatio(2, 6, D.levelPairRateRatioMax)) {
      reasons.push(
        `the first two CB steps are alike (ratio ${ratio.toFixed(2)}) but the next spacing is only ${jump.toFixed(2)} × theirs (≤ ${D.levelPairJumpMax}): not a charging doublet, whose jump to p is Ec + Δsp > Ec; the s level and a p level (a level of g states after s gives g/(2(1 + (2 + g)r)), at least ${levelStepRatio(2, 6, D.levelPairRateRatioMax).toFixed(2)} for r ≤ ${D.levelPairRateRatioMax} whatever g ≤ 6), the peaks after them p's charging peaks or sub-levels: single levels`,
      );
      return "shell-tunneling";
    }
    if (jump <= D.valenceLevelPairJumpMax && valenceLevels(evidence)) {
      reasons.push(
        `the first two CB steps are alike (ratio ${ratio.toFixed(2)}) but the next spacing is only ${jump.toFixed(2)} × theirs (≤ ${D.valenceLevelPairJumpMax}): not a charging doublet; their ratio is below what a level gives after s (${levelStepRatio(2, 6, D.levelPairRateRatioMax).toFixed(2)}), but the second VB step is ${evidence.valenceStepRatio!.toFixed(2)} × the first (≥ ${D.tunnelingStepRatioMin}) and the VB edge level shows no charging peak at the CB pair's spacing: levels on both sides: single levels`,
      );
      return "shell-tunneling";
    }
    const early = ratio >= D.earlyEntryDoubletRatioMin ? earlyEntryJump(cb) : null;
    if (early !== null) {
      reasons.push(
        `the first two CB steps are alike (ratio ${ratio.toFixed(2)} ≥ ${D.earlyEntryDoubletRatioMin}) and the next peak, ${early.stepRatio.toFixed(2)} × the step of the one ${early.spacingRatio.toFixed(2)} × their spacing after it (< ${D.earlyEntryStepRatioMax}), is p entered before s is full; the jump to p's first charging peak is ${early.jump.toFixed(2)} × their spacing (≥ ${D.fillingJumpRatioMin}): an s doublet of charging peaks`,
      );
      return "shell-filling";
    }
    reasons.push(`the first two CB steps are alike (ratio ${ratio.toFixed(2)}) but the next jump is only ${jump.toFixed(2)} × their spacing (< ${D.fillingJumpRatioMin})`);
  } else if (ratio > D.tunnelingSatelliteRatioMax && ratio < D.fillingStepRatio[0]) {
    const extra = extraSecondPeak(cb, evidence);
    if (extra !== null) {
      reasons.push(
        `the second CB step is ${ratio.toFixed(2)} × the first, but the third CB peak${extra.subLevels ? ` with the ${extra.subLevels} sub-level(s) close after it` : ""} steps ${extra.thirdRatio.toFixed(2)} × the first and the second VB step ${extra.valenceRatio.toFixed(2)} × the first VB step (both ≥ ${D.tunnelingStepRatioMin}): levels of more states on both sides, so the second CB peak is no charging peak of s; the p shell decides`,
      );
    } else {
      reasons.push(
        `the second CB step is ${ratio.toFixed(2)} × the first: too strong for a charging satellite (≤ ${D.tunnelingSatelliteRatioMax}), too weak for an s doublet (≥ ${D.fillingStepRatio[0]}): an intermediate rate ratio`,
      );
      return "undetermined";
    }
  }
  // Shell tunnelling: the p shell (the second main peak and any sub-levels close to it) carries
  // more than the s step.
  const satellites = cb.length - main.length;
  const note = satellites ? `; ${satellites} weak peak(s) set aside as charging satellites` : "";
  // An extra second peak (note 3) is no level: p is the shell after it.
  const extra = extraCbPeak(cb, evidence);
  const levels = main.filter((p) => p !== extra);
  const pShell = levels.length >= 2 ? tunnelingShells(levels)[1] : [];
  const pRatio = pShell.reduce((a, p) => a + p.peak.stepA, 0) / main[0].peak.stepA;
  if (pRatio >= D.tunnelingStepRatioMin) {
    const sub = pShell.length > 1 ? ` (${pShell.length} sub-levels together)` : "";
    reasons.push(`the p shell${sub} carries ${pRatio.toFixed(2)} × the s step (≥ ${D.tunnelingStepRatioMin}; p holds 6 electrons, s 2): single levels` + note);
    return "shell-tunneling";
  }
  // A measured charging satellite of s gives r = q/(1 − q) ≤ 3/7; the p step then needs only to be
  // what a level of at least two states gives at that r (levelStepRatio), with a margin for noise.
  if (ratio >= D.satelliteEvidenceMin && ratio <= D.satelliteEvidenceMax && pShell.length) {
    const r = rateRatioFromStepRatio(ratio);
    const least = D.levelStepMargin * levelStepRatio(2, 2, r);
    if (pRatio >= least) {
      reasons.push(
        `the second CB step is ${ratio.toFixed(2)} × the first: a charging satellite of s, so Γtip/Γsub ≈ ${r.toFixed(2)} (q/(1 − q)); the p shell carries ${pRatio.toFixed(2)} × the s step (≥ ${least.toFixed(2)}, ${D.levelStepMargin} × what a doubly degenerate level gives at that ratio): single levels` +
          note,
      );
      return "shell-tunneling";
    }
  }
  reasons.push(
    `the p shell carries ${pShell.length ? pRatio.toFixed(2) : "no"} × the s step: neither an s doublet (${D.fillingStepRatio.join("–")} with a larger jump to p) nor an s/p pair (≥ ${D.tunnelingStepRatioMin})` +
      note,
  );
  return "undetermined";
}

/**
 * The extra second CB peak of note 3 of {@link classifyRegime}: the second CB peak where its step
 * over the first lies in the intermediate band (above `ASSIGN_DEFAULTS.tunnelingSatelliteRatioMax`,
 * below `ASSIGN_DEFAULTS.fillingStepRatio[0]`) while the third CB peak and the second VB step both
 * carry at least `ASSIGN_DEFAULTS.tunnelingStepRatioMin` × the first; null otherwise.
 *
 * Parameters
 * ----------
 * cb : readonly BandPeak[]
 *     CB peaks from the gap edge outward, noise set aside (as given to {@link classifyRegime}).
 * ratios : Pick<RegimeRatios, "secondToFirstStepRatio" | "valenceStepRatio" | "valenceTwinStepRatio">
 *     From {@link regimeRatios} on the same peaks and the VB main peaks.
 *
 * Returns
 * -------
 * BandPeak | null
 *     `cb[1]` when it is such a peak.
 *
 * Notes
 * -----
 * 1. Levels of more states than s on both sides are shell tunnelling's signature; a rate ratio in
 *    the crossover would make the second peak a charging peak of s, and the third step like it.
 *    The peak between is then no level of the tip-side ladder (at low η, the second resonance of
 *    a band-edge level through the substrate junction, Ec/(1 − η) beyond the predicted one): the
 *    p shell is read after it, and the shell-tunnelling ladder sets it aside as a charging
 *    satellite of s is (a weaker one, below `ASSIGN_DEFAULTS.satelliteStepRatioMax` × s, already
 *    is).
 * 2. A split p steps per sub-level about as s does, so its first sub-level alone can fall short of
 *    `ASSIGN_DEFAULTS.tunnelingStepRatioMin` × s. Where the third CB peak alone does, the shell it
 *    opens (it and the sub-levels close to it, `tunnelingShells` read with s first) counts, if it
 *    carries from `tunnelingStepRatioMin` to `ASSIGN_DEFAULTS.splitShellStepRatioMax` × s: a level
 *    of g states after s steps g/(2(1 + (2 + g)r)) × s, at most 3 for the six states of p,
 *    whereas in the crossover the shell gathers p's charging peaks, each a fair part of s's step.
 *    And not where the VB edge level shows a weaker peak one CB pair's spacing beyond it
 *    (`valenceTwinStepRatio` below `ASSIGN_DEFAULTS.valenceTwinStepRatioMax`, see `regimeRatios`
 *    note 4): its charging doublet, Ec/η apart as s's would be, so the CB pair is that doublet.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, index: number) => ({ x, index, peak: { biasV: x, stepA } as Peak });
 * const cb = [at(2.43, 1e-12, 2), at(2.74, 0.55e-12, 3), at(3.01, 2.8e-12, 4)];
 * extraCbPeak(cb, { secondToFirstStepRatio: 0.55, valenceStepRatio: 1.9, valenceTwinStepRatio: null })?.index;  // => 3
 * ```
 */
export function extraCbPeak(cb: readonly BandPeak[], ratios: Pick<RegimeRatios, "secondToFirstStepRatio" | "valenceStepRatio" | "valenceTwinStepRatio">): BandPeak | null {
  const D = ASSIGN_DEFAULTS;
  const ratio = ratios.secondToFirstStepRatio;
  if (ratio === null || ratio <= D.tunnelingSatelliteRatioMax || ratio >= D.fillingStepRatio[0]) return null;
  return extraSecondPeak(cb, ratios) === null ? null : cb[1];
}

/**
 * Where the first two CB steps are in the intermediate band (note 3 of {@link classifyRegime}):
 * the third CB peak's step over the first (or that of the split shell it opens, note 2 of
 * {@link extraCbPeak}) and the second VB step over the first when both are at
 * least `ASSIGN_DEFAULTS.tunnelingStepRatioMin` (levels of more states than s on both sides:
 * shell tunnelling's signature, note 4), else null. The second CB peak is then no charging peak
 * of s but an extra peak between s and p — at low η the second resonance of a band-edge level,
 * Ec/(1 − η) beyond the one predicted, which nothing predicts without Ec.
 */
function extraSecondPeak(cb: readonly BandPeak[], ratios: Pick<RegimeRatios, "valenceStepRatio" | "valenceTwinStepRatio">): { thirdRatio: number; valenceRatio: number; subLevels: number } | null {
  const min = ASSIGN_DEFAULTS.tunnelingStepRatioMin;
  const valenceStepRatio = ratios.valenceStepRatio;
  if (cb.length < 3 || valenceStepRatio === null || valenceStepRatio < min) return null;
  const thirdRatio = cb[2].peak.stepA / cb[0].peak.stepA;
  if (thirdRatio >= min) return { thirdRatio, valenceRatio: valenceStepRatio, subLevels: 0 };
  // A split p (note 2): the shell the third peak opens, unless the VB edge level shows the
  // doublet that makes the CB pair s's charging peaks.
  if (!valenceLevels(ratios)) return null;
  const shell = tunnelingShells([cb[0], ...cb.slice(2)])[1];
  const shellRatio = shell.reduce((a, p) => a + p.peak.stepA, 0) / cb[0].peak.stepA;
  return shellRatio >= min && shellRatio <= ASSIGN_DEFAULTS.splitShellStepRatioMax ? { thirdRatio: shellRatio, valenceRatio: valenceStepRatio, subLevels: shell.length - 1 } : null;
}

/**
 * Near the filling limit with Δsp close to Ec, p's level is entered while s holds one carrier, at
 * ε_p + 1.5·Ec: a peak between the s doublet and p's first charging peak, one Ec before the
 * latter and much weaker (about half its step near Γtip/Γsub = 1.5–2), which makes the jump after
 * the doublet look like a single Ec. The jump measured to the peak after it instead, when the
 * third peak (the first at least `satelliteStepRatioMax` × the second's step) has a next peak on
 * the ladder (at least `minLadderSpacingFraction` × the doublet's spacing after it) within
 * (1 + `subgroupExtraMin`) × that spacing, carries less than `earlyEntryStepRatioMax` × its
 * step (a rate ratio well inside shell filling), and that jump is at least `fillingJumpRatioMin` × the doublet's spacing; null otherwise.
 * The same rule sets the peak aside when the shells are built (`fillingShells`).
 */
function earlyEntryJump(cb: readonly BandPeak[]): { jump: number; stepRatio: number; spacingRatio: number } | null {
  const D = ASSIGN_DEFAULTS;
  const spacing = cb[1].x - cb[0].x;
  const k = cb.findIndex((p, i) => i >= 2 && p.peak.stepA >= D.satelliteStepRatioMax * cb[1].peak.stepA);
  if (k < 0 || spacing <= 0) return null;
  const next = cb.slice(k + 1).find((q) => q.x - cb[k].x >= D.minLadderSpacingFraction * spacing);
  if (!next || next.x - cb[k].x > (1 + D.subgroupExtraMin) * spacing) return null;
  const stepRatio = cb[k].peak.stepA / next.peak.stepA;
  const jump = (next.x - cb[1].x) / spacing;
  if (stepRatio >= D.earlyEntryStepRatioMax || jump < D.fillingJumpRatioMin) return null;
  return { jump, stepRatio, spacingRatio: (next.x - cb[k].x) / spacing };
}

/**
 * Two alike CB steps and nothing after them: an s doublet of charging peaks (shell filling), or
 * the s level and a doubly degenerate p sub-level (shell tunnelling, the window ending inside a
 * split p shell). Both give two steps of about the same height (r/(1 + r) for the doublet,
 * `levelStepRatio(2, 2, r)` = 1/(1 + 4r) of lib/model/regimeLimits.ts for two levels), so the VB decides: in shell
 * filling its first two main peaks are a charging doublet too, with the same spacing (Ec) and
 * alike steps; in shell tunnelling they are levels, the second usually of higher degeneracy.
 */
function pairWithoutThird(ratio: number, evidence: RegimeEvidence): Regime {
  const D = ASSIGN_DEFAULTS;
  const reasons = evidence.reasons;
  const head = `the first two CB steps are alike (ratio ${ratio.toFixed(2)} within ${D.fillingStepRatio.join("–")}) and no third CB peak follows: an s doublet or the s level and a p sub-level`;
  const vStep = evidence.valenceStepRatio;
  const vSpacing = evidence.valenceSpacingRatio;
  if (vStep === null || vSpacing === null) {
    reasons.push(`${head}; fewer than two VB peaks to tell them apart`);
    return "undetermined";
  }
  const alike = vStep >= D.fillingStepRatio[0] && vStep <= D.fillingStepRatio[1];
  const sameSpacing = Math.abs(vSpacing - 1) <= D.valenceChargingTolerance;
  if (alike && sameSpacing) {
    reasons.push(`${head}; the first two VB steps are alike too (ratio ${vStep.toFixed(2)}) at ${vSpacing.toFixed(2)} × the CB spacing (within 1 ± ${D.valenceChargingTolerance}): charging doublets of one Ec on both sides`);
    return "shell-filling";
  }
  if (vStep >= D.tunnelingStepRatioMin || !sameSpacing) {
    const why = vStep >= D.tunnelingStepRatioMin ? `the second VB step is ${vStep.toFixed(2)} × the first (≥ ${D.tunnelingStepRatioMin}): a level of more states, not a charging peak` : `the first two VB peaks are ${vSpacing.toFixed(2)} × the CB spacing apart (outside 1 ± ${D.valenceChargingTolerance}): not one Ec`;
    reasons.push(`${head}; ${why}, so the CB pair is two single levels`);
    return "shell-tunneling";
  }
  reasons.push(`${head}; the VB (step ratio ${vStep.toFixed(2)}, spacing ${vSpacing.toFixed(2)} × the CB's) supports neither reading`);
  return "undetermined";
}

/**
 * The VB read by the CB's shell-filling rule (note 2 of {@link classifyRegime}): a charging
 * doublet of alike steps, then a longer jump to the next level.
 *
 * Parameters
 * ----------
 * vb : readonly BandPeak[]
 *     VB main peaks (noise, charging satellites and second-junction resonances set aside) from
 *     the gap edge outward (`x` = |bias|, V).
 *
 * Returns
 * -------
 * { stepRatio: number; jumpRatio: number } | null
 *     The second VB step over the first and the spacing from VB peak 2 to the next peak that is
 *     not its weak satellite over that of peaks 1–2 (read as {@link regimeRatios} reads the CB),
 *     when the step ratio lies within `ASSIGN_DEFAULTS.fillingStepRatio` and the jump is at least
 *     `ASSIGN_DEFAULTS.fillingJumpRatioMin`; null otherwise (also with fewer than three peaks).
 *
 * Notes
 * -----
 * 1. In shell filling (Γtip/Γsub = r ≥ 1.5) the VB edge level of two states gives two charging
 *    peaks one Ec apart, the second stepping r/(1 + r) ≥ 0.6 of the first, then a jump of Ec plus
 *    the level spacing to the next level: the CB's s doublet rule holds for the VB as it stands.
 * 2. In shell tunnelling the first two VB main peaks are two levels, the second of more states
 *    and stepping more (a level of g states after one of two steps g/(2(1 + (2 + g)r)) of it:
 *    about 2 for g = 4 deep in the regime, above the filling range). In the crossover the edge
 *    level's second charging peak steps less than 0.6 of the first, or is set aside as its
 *    satellite; the two main peaks are then two levels, and the next spacing, one Ec inside the
 *    second level, is shorter than theirs.
 * 3. The VB holds no second-junction resonance of a VB level (those fall at positive bias); the
 *    CB's fall at −η·V/(1 − η) of CB peaks and are set aside before. So where, at low η, the VB
 *    levels' resonances in the CB window make the CB ladder read as another regime, the VB still
 *    reads as it is.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, index: number) => ({ x, index, peak: { biasV: -x, stepA } as Peak });
 * // A doublet 0.25 V apart (steps 1.0, 0.9), then a level 0.6 V further out.
 * valenceFillingDoublet([at(1.5, 1e-11, 3), at(1.75, 0.9e-11, 2), at(2.35, 1e-11, 1)]);
 * // => { stepRatio: 0.9, jumpRatio: 2.4 }
 * ```
 */
export function valenceFillingDoublet(vb: readonly BandPeak[]): { stepRatio: number; jumpRatio: number } | null {
  const D = ASSIGN_DEFAULTS;
  const { secondToFirstStepRatio: stepRatio, thirdToSecondSpacingRatio: jumpRatio } = regimeRatios(vb);
  if (stepRatio === null || jumpRatio === null) return null;
  if (stepRatio < D.fillingStepRatio[0] || stepRatio > D.fillingStepRatio[1] || jumpRatio < D.fillingJumpRatioMin) return null;
  return { stepRatio, jumpRatio };
}

/**
 * Whether the VB reads as single levels (note 3 of {@link classifyRegime}): its second main step at
 * least `ASSIGN_DEFAULTS.tunnelingStepRatioMin` × its first (a level of more states, not a
 * charging peak, which steps r/(1 + r) < 1 of the first) and no weaker peak one CB pair's spacing
 * beyond its edge peak (`valenceTwinStepRatio` null or at least
 * `ASSIGN_DEFAULTS.valenceTwinStepRatioMax`: the edge level shows no charging doublet there).
 */
function valenceLevels(ratios: Pick<RegimeRatios, "valenceStepRatio" | "valenceTwinStepRatio">): boolean {
  const D = ASSIGN_DEFAULTS;
  const v = ratios.valenceStepRatio, twin = ratios.valenceTwinStepRatio;
  return v !== null && v >= D.tunnelingStepRatioMin && (twin === null || twin >= D.valenceTwinStepRatioMax);
}
