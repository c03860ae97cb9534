/**
 * The thresholds of the assignment's classification and grouping rules, in one place for every
 * stage of {@link assignSpectrum} (regime, satellites, shells, valence groups).
 */

import { REGIME_LIMITS, secondToFirstStepRatio, substrateToTipStepRatio } from "../model/regimeLimits.ts";

/**
 * Thresholds of the classification and grouping rules (locked by a test). Re-exported by
 * `assignSpectrum.ts`, where users import it.
 */
export const ASSIGN_DEFAULTS = Object.freeze({
  eta: 1,
  /** Set aside second-junction resonances (with η given and below 1). */
  secondJunction: true,
  /**
   * Shell filling: the second CB step over the first lies in this range. In orthodox theory it is
   * r/(1 + r) for r = Γtip/Γsub (≥ 0.6 ⇔ r ≥ 1.5, never above 1); the upper bound leaves room for noise.
   */
  fillingStepRatio: [REGIME_LIMITS.fillingStepRatioMin, 1.3] as readonly [number, number],
  /** Shell tunnelling: a second CB step at most this fraction of the first is a charging satellite of s (r/(1 + r) ≤ 0.3 ⇔ r ≤ 0.43); between this and the filling range the spectrum is intermediate. */
  tunnelingSatelliteRatioMax: REGIME_LIMITS.tunnelingStepRatioMax,
  /** Shell tunnelling: the p shell (its sub-levels together) carries at least this many times the s step (p: 6 vs 2 electrons). */
  tunnelingStepRatioMin: 1.4,
  /** A CB peak whose step is below this fraction of the preceding main peak is a charging satellite (shell tunnelling). */
  satelliteStepRatioMax: 0.5,
  /** A peak whose step is below this fraction of the band's median step is noise or a satellite wherever it lies. */
  noiseStepRatioMax: 0.2,
  /** Shell filling: the s→p jump must exceed the s spacing by this factor (Δsp > 0.25·Ec). */
  fillingJumpRatioMin: 1.25,
  /** Two alike first CB steps followed by a spacing at most this fraction of theirs are two levels, not a charging doublet (whose jump to p is Ec + Δsp). */
  levelPairJumpMax: 0.8,
  /**
   * … provided their step ratio is at least levelStepRatio(2, 6, this) = 3/(1 + 8·this) (0.79): the
   * least a level of up to six states gives after s at a rate ratio up to this (a margin below
   * the tunnelling limit 3/7, where intermediate spectra begin).
   */
  levelPairRateRatioMax: 0.35,
  /**
   * Two alike first CB steps below that ratio are two levels only with a next spacing at most
   * this fraction of theirs and the VB's levels in support (`classifyRegime` note 3): without the
   * step ratio's bound on Γtip/Γsub, a margin below `levelPairJumpMax` keeps a doublet near the
   * filling limit with an unpredicted resonance after it on the doublet's side.
   */
  valenceLevelPairJumpMax: 0.6,
  /** A second CB step from this fraction of the first … */
  satelliteEvidenceMin: 0.1,
  /** … to this one is a measured charging satellite of s that places r = q/(1 − q) on the tunnelling side (0.2: r ≤ 0.25, a margin below 3/7 for the satellite's step, which reads low near the boundary). */
  satelliteEvidenceMax: 0.2,
  /** With a measured satellite, the p shell needs this fraction of levelStepRatio(2, 2, r) = 1/(1 + 4r) × the s step (noise margin). */
  levelStepMargin: 0.8,
  /** Shell filling: a CB peak closer than this fraction of Ec to the previous charging peak is off the ladder (set aside). */
  minLadderSpacingFraction: 0.65,
  /** When a shell has more charging-ladder candidates than it holds, the extras weaker than this fraction of the candidates' median step are charging satellites. */
  leadingSatelliteRatioMax: 0.6,
  /**
   * Regime: a weak third CB peak one spacing before a stronger one is p entered before s is full
   * (shell filling) when its step is below this fraction of the next. The project's master
   * equation gives 0.65, 0.60, 0.535, 0.46 and 0.36 at Γtip/Γsub = 1, 1.2, 1.5, 2 and 3 (s and p
   * of 2 and 6 states, whatever Δsp); 0.48 (r ≈ 1.85) leaves a margin above the filling limit
   * 1.5 for the noise of measured steps.
   */
  earlyEntryStepRatioMax: 0.48,
  /**
   * … and the s doublet's step ratio is at least this (r/(1 + r) at Γtip/Γsub = 7/3): each of the
   * two ratios scatters by about ±0.1 in 0.2–1 % noise, so the rule asks both to point well
   * inside shell filling.
   */
  earlyEntryDoubletRatioMin: 0.7,
  /**
   * A dip in a shell's steps (below both neighbours) counts as an extra only below this fraction of
   * the shell's median step: a higher sub-level entered early carries 0.6–0.65 of it near
   * Γtip/Γsub = 3 (master equation), a charging peak next to a strong resonance about 1.
   */
  dipTypicalRatioMax: 0.7,
  /** Inside a multiplet, a spacing above (1 + this)·Ec starts a sub-group. */
  subgroupExtraMin: 0.2,
  /** A jump whose excess over Ec exceeds this fraction of the s→p excess starts a new shell. */
  newShellExcessFraction: 0.9,
  /** Shell tunnelling: a main peak closer to the previous one than this fraction of the s→p distance is a sub-level of the same shell. */
  tunnelingSublevelFraction: 0.5,
  /**
   * Shell tunnelling deep in the regime (see `tunnelingDeepSatelliteMax`): … or closer than this
   * fraction while p's steps say it is short of its six states (`tunnelingSublevelFirstStepMax`,
   * `tunnelingSublevelStepMax`): a d shell lies at least one s→p distance above p in the usual
   * confinement potentials (harmonic: Δpd = Δsp; spherical well: Δpd ≈ 1.26 Δsp from the zeros of
   * the spherical Bessel functions j₀, j₁, j₂: 3.14, 4.49, 5.76), 0.75 leaves a quarter for scatter.
   */
  tunnelingSublevelStepFraction: 0.75,
  /**
   * … deep in shell tunnelling: no CB charging satellite steps this fraction of the s step or more.
   * A level's charging satellite steps about r/(1 + r) of its entry (the s doublet's closed form,
   * r = Γtip/Γsub), so none at 0.1 means r ≤ 1/9, where a level of g states after s steps
   * g/(2(1 + (2 + g)r)) × s: a 2-state sub-level at most 1, the whole p at least 1.59.
   */
  tunnelingDeepSatelliteMax: 0.1,
  /**
   * … counting only s's own charging satellite (between s and the next level): a deeper level's
   * tip-side charging peak follows no r/(1 + r) of the s step (its second carrier may enter any
   * level below it), and at Γtip/Γsub ≈ 0.02 one steps 0.2 × s. Chosen on the accuracy benchmark
   * (low-η shell-tunnelling draws with p1's charging peak beyond p2).
   */
  tunnelingDeepSatelliteOfSOnly: true,
  /**
   * … and a level lying at a VB peak's plain second-junction resonance (a peak kept as a level
   * there) is judged by its step less the least share a resonance takes of its source's
   * (`SECOND_JUNCTION_DEFAULTS.ownShareSourceStepRatioMin`, ½): the substrate side steps there too.
   * Chosen on the accuracy benchmark (low-η shell-tunnelling draws whose p1 lies at a resonance).
   */
  tunnelingDeepLessResonanceShare: true,
  /** … when p's first level steps at most this multiple of the s step: a 2-state sub-level (≤ 1), not the whole p (≥ 1.59 for r ≤ 1/9). */
  tunnelingSublevelFirstStepMax: 1.3,
  /**
   * … and p's levels so far step together at most this multiple of the s step: fewer than six
   * states (four give at most 2 × s, the whole p about 3 × deep in the regime).
   */
  tunnelingSublevelStepMax: 2.5,
  /** Shell tunnelling with Ec from a charging satellite: a CB peak within (1 ± this)·Ec of the one before it is a charging peak of that level. */
  levelChargingTolerance: 0.15,
  /**
   * A band-edge level's second-junction resonance carrying at least this multiple of its
   * tip-side step reads as shell filling: (g·r + 1)/(g + r) for g = 2 at r = 3, twice the filling
   * limit for a margin (7/5 = 1.4; `substrateToTipStepRatio` in lib/model/regimeLimits.ts).
   */
  fillingResonanceStepMin: substrateToTipStepRatio(2, 2 * REGIME_LIMITS.fillingRateRatioMin),
  /**
   * Where the band-edge resonances read weaker than `fillingResonanceStepMin`, a VB charging
   * doublet whose second step is at least this multiple of its first reads as shell filling when
   * a resonance hides the CB's second s peak: r/(1 + r) at r = 3, the same margin over the
   * filling limit (3/4; `secondToFirstStepRatio` in lib/model/regimeLimits.ts).
   */
  valenceDoubletStepRatioMin: secondToFirstStepRatio(2 * REGIME_LIMITS.fillingRateRatioMin),
  /** Valence band, shell filling: a spacing within (1 ± this)·Ec keeps two peaks in one group. */
  valenceChargingTolerance: 0.3,
  /**
   * Regime, an extra second CB peak (`extraCbPeak`): a VB peak one CB pair's spacing beyond the
   * VB edge peak stepping below this multiple of it is the edge level's second charging peak
   * (r/(1 + r) < 1 of its first for every rate ratio r), so the CB pair is s's charging doublet.
   */
  valenceTwinStepRatioMax: 1,
  /**
   * Regime, an extra second CB peak: a split p read as the shell its first sub-level opens carries
   * at most this multiple of the s step (a level of g states after s steps g/(2(1 + (2 + g)r)) × s,
   * below g/2 = 3 for p's six states at every rate ratio r).
   */
  splitShellStepRatioMax: 3,
});
