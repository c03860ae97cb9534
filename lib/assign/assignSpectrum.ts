/**
 * From the peaks of one conductance curve to the assigned spectrum: regime, multiplets by
 * degeneracy, and the gap, charging energy and level spacings with uncertainties.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { fitLadderSpacing } from "./ladderFit.ts";
import { checkRange } from "../util/check.ts";

export type Regime = "shell-filling" | "shell-tunneling" | "undetermined";
export type Band = "CB" | "VB";

/** A group of peaks that belong to one level (or one charging multiplet of one level). */
export interface Multiplet {
  band: Band;
  /** "s", "p", "d" for the conduction band; "v1", "v2", … from the gap edge for the valence band. */
  label: string;
  /** Expected number of electrons of the shell (2, 6, 10); null for valence-band groups. */
  degeneracy: number | null;
  /** Peak positions in V, ordered from the gap edge outward. */
  peaksV: number[];
  /** Their 1σ uncertainties in V. */
  peakUncertaintiesV: number[];
  /** Peaks found in the multiplet. */
  found: number;
  /**
   * Peaks expected: the degeneracy in shell filling (one per added electron), 1 per level in
   * shell tunnelling, null where degeneracy is not assumed (valence band).
   */
  expected: number | null;
  /** Sizes of the sub-groups when a multiplet is split (e.g. [2, 4] for a p sextet split by shape anisotropy); [found] otherwise. */
  subgroups: number[];
}

/** The numbers users tabulate, bias-referred (V); null where the regime does not define them. */
export interface SpectrumQuantities {
  /** First CB peak − first VB peak, V. */
  gapV: number | null;
  /** Charging (addition) energy Ec in bias: mean spacing inside the CB multiplets, V. */
  chargingEnergyV: number | null;
  /** gap − Ec, V (shell filling only). */
  singleParticleGapV: number | null;
  /** s–p spacing in bias, V: (first p − last s) − Ec in shell filling, p − s in shell tunnelling. */
  levelSpacingSPV: number | null;
  /** p–d spacing in bias when a d shell is seen, V. */
  levelSpacingPDV: number | null;
  /** Jumps between successive VB groups (less Ec in shell filling), V, from the gap edge outward. */
  valenceSpacingsV: number[];
}

/** 1σ uncertainties of {@link SpectrumQuantities}, same keys, V. */
export type SpectrumUncertainties = { [K in keyof SpectrumQuantities]: SpectrumQuantities[K] };

/** The quantities as energies after voltage division, eV (null where the regime does not define them). */
export interface EnergyValues {
  gapEV: number | null;
  chargingEnergyEV: number | null;
  singleParticleGapEV: number | null;
  levelSpacingSPEV: number | null;
  levelSpacingPDEV: number | null;
  valenceSpacingsEV: number[];
}

/** The same quantities as energies after voltage division (eV), with the η used and 1σ uncertainties. */
export interface SpectrumEnergies extends EnergyValues {
  eta: number;
  /** Whether η came from the user (false: the default 1 was used and energies equal bias values). */
  etaGiven: boolean;
  uncertainties: EnergyValues;
}

/** Why the regime was chosen: the numbers the rules looked at. */
export interface RegimeEvidence {
  /** Step of the second CB peak over the first (areas); null with fewer than two CB peaks. */
  secondToFirstStepRatio: number | null;
  /** Spacing from CB peak 2 to the next peak that is not its weak satellite, over that of peaks 1–2; null without one. */
  thirdToSecondSpacingRatio: number | null;
  /** CB peaks taken as charging satellites (weak peaks after a main peak) in shell tunnelling. */
  satellitePeaksV: number[];
  /** The rules that decided, in words. */
  reasons: string[];
}

/** Options of {@link assignSpectrum}. */
export interface AssignOptions {
  /** Voltage-division factor η in (0, 1]. Default 1 (energies = bias values, noted in warnings). */
  eta?: number;
  /** Force a regime instead of classifying. Default: classify. */
  regime?: Regime;
}

/** Assigned spectrum of one curve. */
export interface Assignment {
  regime: Regime;
  evidence: RegimeEvidence;
  multiplets: Multiplet[];
  quantities: SpectrumQuantities;
  uncertainties: SpectrumUncertainties;
  energies: SpectrumEnergies;
  warnings: string[];
}

/** Thresholds of the classification and grouping rules (locked by a test). */
export const ASSIGN_DEFAULTS = Object.freeze({
  eta: 1,
  /**
   * Shell filling: the second CB step over the first lies in this range. In orthodox theory it is
   * r/(1 + r) for r = Γtip/Γsub (≥ 0.6 ⇔ r ≥ 1.5, never above 1); the upper bound leaves room for noise.
   */
  fillingStepRatio: [0.6, 1.3] as readonly [number, number],
  /** Shell tunnelling: a second CB step at most this fraction of the first is a charging satellite of s (r/(1 + r) ≤ 0.3 ⇔ r ≤ 0.43); between this and the filling range the spectrum is intermediate. */
  tunnelingSatelliteRatioMax: 0.3,
  /** Shell tunnelling: the p shell (its sub-levels together) carries at least this many times the s step (p: 6 vs 2 electrons). */
  tunnelingStepRatioMin: 1.4,
  /** A CB peak whose step is below this fraction of the preceding main peak is a charging satellite (shell tunnelling). */
  satelliteStepRatioMax: 0.5,
  /** A peak whose step is below this fraction of the band's median step is noise or a satellite wherever it lies. */
  noiseStepRatioMax: 0.2,
  /** Shell filling: the s→p jump must exceed the s spacing by this factor (Δsp > 0.25·Ec). */
  fillingJumpRatioMin: 1.25,
  /** Shell filling: a CB peak closer than this fraction of Ec to the previous charging peak is off the ladder (set aside). */
  minLadderSpacingFraction: 0.65,
  /** When a shell has more charging-ladder candidates than it holds, the extras weaker than this fraction of the candidates' median step are charging satellites. */
  leadingSatelliteRatioMax: 0.6,
  /** Inside a multiplet, a spacing above (1 + this)·Ec starts a sub-group. */
  subgroupExtraMin: 0.2,
  /** A jump whose excess over Ec exceeds this fraction of the s→p excess starts a new shell. */
  newShellExcessFraction: 0.9,
  /** Shell tunnelling: a main peak closer to the previous one than this fraction of the s→p distance is a sub-level of the same shell. */
  tunnelingSublevelFraction: 0.5,
  /** Valence band, shell filling: a spacing within (1 ± this)·Ec keeps two peaks in one group. */
  valenceChargingTolerance: 0.3,
});

const SHELLS = [
  { label: "s", degeneracy: 2 },
  { label: "p", degeneracy: 6 },
  { label: "d", degeneracy: 10 },
  { label: "f", degeneracy: 14 },
] as const;

interface Indexed {
  peak: Peak;
  /** Distance from the gap edge side: |biasV|. */
  x: number;
}

/**
 * Assigns the peaks of one conductance curve.
 *
 * Notes:
 * 1. CB peaks are those at positive bias, VB at negative; each list is ordered from the gap
 *    edge outward.
 * 2. Peaks whose step is below 0.2 × the band's median step are noise and set aside.
 * 3. Regime, from the first CB peaks (in shell filling the s level gives two charging peaks
 *    of similar height, the second r/(1 + r) of the first for r = Γtip/Γsub; in shell tunnelling
 *    one peak, followed by a p peak two to three times higher):
 *    a. second/first step ratio in [0.6, 1.3] and, if a third peak exists, a jump to it of at
 *       least 1.25 × the first spacing → shell filling;
 *    b. ratio in (0.3, 0.6) → undetermined (intermediate: too strong for a satellite, too weak
 *       for a doublet);
 *    c. otherwise, after setting aside charging satellites (steps below 0.5 × the preceding
 *       main peak), the p shell — the second main peak with the main peaks closer to it than
 *       half its distance from s (sub-levels of a split p) — carries ≥ 1.4 × the s step →
 *       shell tunnelling; else undetermined.
 * 4. Shell filling: s = the first two CB peaks; the p multiplet the next peaks, up to six, d the
 *    next up to ten. Inside a multiplet a spacing above 1.2·Ec starts a sub-group (anisotropic
 *    split); a jump whose excess over Ec is more than 0.9 × the s→p excess starts the next
 *    shell early (a partly resolved multiplet); a peak closer than 0.65·Ec to the previous
 *    charging peak is not on the ladder and is set aside. When more candidates than the shell
 *    holds come before the jump to the next shell, a first candidate below 0.5 × the second is
 *    the shell's charging satellite (steps fall along a multiplet); then the weakest extras
 *    (below 0.6 × the median step) are satellites; if they are not that weak, the shell takes
 *    the first g. Ec = common spacing of all groups by weighted
 *    least squares ({@link fitLadderSpacing}), sub-groups with their own intercepts.
 * 5. Shell tunnelling: one peak per level; main peaks closer to the previous main peak than half
 *    the s→p distance are sub-levels of the same shell (a split p).
 * 6. Valence band: in shell filling consecutive peaks spaced within (1 ± 0.3)·Ec form a group
 *    (a charging multiplet); otherwise each peak is its own group. Labels v1, v2, … from the
 *    gap edge; degeneracy is not assumed.
 * 7. Quantities as in the trade's practice (domain brief §3): gap = first CB − first VB peak;
 *    single-particle gap = gap − Ec; Δsp = (first p − last s) − Ec in shell filling, p − s in
 *    shell tunnelling (Ec null there); VB group spacing = first peak of the next group − last
 *    peak of the previous, less Ec in shell filling. Uncertainties propagate the peak-position
 *    uncertainties in quadrature (correlations neglected) and the standard error of Ec.
 * 8. Energies: bias-referred values × η (eV per V of bias across the tip junction).
 */
export function assignSpectrum(peaks: readonly Peak[], options: AssignOptions = {}): Assignment {
  const D = ASSIGN_DEFAULTS;
  const etaGiven = options.eta !== undefined;
  const eta = etaGiven ? checkRange("eta", options.eta, 1e-6, 1) : D.eta;
  const warnings: string[] = [];
  if (!etaGiven) warnings.push("eta not given: energies equal the bias-referred values (η = 1); pass the voltage-division factor to convert");

  const cbAll: Indexed[] = peaks.filter((p) => p.biasV > 0).map((peak) => ({ peak, x: peak.biasV }));
  const vbAll: Indexed[] = peaks
    .filter((p) => p.biasV < 0)
    .map((peak) => ({ peak, x: -peak.biasV }))
    .sort((a, b) => a.x - b.x);

  const evidence: RegimeEvidence = { secondToFirstStepRatio: null, thirdToSecondSpacingRatio: null, satellitePeaksV: [], reasons: [] };
  // Peaks at the noise level of their band go first; charging satellites (weak peaks after a
  // main peak) are told apart only once the regime is known.
  const cbNoise = splitSatellites(cbAll, D.noiseStepRatioMax, 0);
  const vbNoise = splitSatellites(vbAll, D.noiseStepRatioMax, 0);
  const cbClean = cbNoise.main;
  const cbSplit = splitSatellites(cbClean, 0, D.satelliteStepRatioMax);
  const vbSplit = splitSatellites(vbNoise.main, 0, D.satelliteStepRatioMax);
  const vb = vbSplit.main;
  if (cbClean.length >= 2) evidence.secondToFirstStepRatio = cbClean[1].peak.stepA / cbClean[0].peak.stepA;
  // The jump to the next peak that is not a weak satellite of the second.
  const third = cbClean.slice(2).find((p) => p.peak.stepA >= D.satelliteStepRatioMax * cbClean[1].peak.stepA);
  if (third) evidence.thirdToSecondSpacingRatio = (third.x - cbClean[1].x) / (cbClean[1].x - cbClean[0].x);

  let regime: Regime = options.regime ?? classify(cbClean, cbSplit.main, evidence);
  const cb = regime === "shell-filling" ? cbClean : cbSplit.main;
  const setAside = [...cbNoise.satellites, ...vbNoise.satellites, ...vbSplit.satellites, ...(regime === "shell-filling" ? [] : cbSplit.satellites)];
  evidence.satellitePeaksV = setAside.map((p) => p.peak.biasV).sort((a, b) => a - b);
  if (options.regime) evidence.reasons.push(`regime ${options.regime} given by the user`);

  const multiplets: Multiplet[] = [];
  let ecV: number | null = null;
  let ecSE: number | null = null;
  const cbGroups: Indexed[][][] = []; // per shell: its sub-groups
  if (regime === "shell-filling") {
    const built = fillingShells(cb);
    cbGroups.push(...built.shells);
    if (built.offLadder.length) {
      evidence.satellitePeaksV = [...evidence.satellitePeaksV, ...built.offLadder.map((p) => p.peak.biasV)].sort((a, b) => a - b);
      evidence.reasons.push(`${built.offLadder.length} CB peak(s) closer than ${ASSIGN_DEFAULTS.minLadderSpacingFraction} × Ec to the previous charging peak set aside`);
    }
    const fit = fitLadderSpacing(
      built.shells.flat().map((g) => ({ positionsV: g.map((p) => p.x), sigmasV: g.map((p) => p.peak.biasUncertaintyV) })),
    );
    if (fit) {
      ecV = fit.spacingV;
      ecSE = fit.spacingSEV;
    }
    if (built.leftover.length) warnings.push(`${built.leftover.length} CB peak(s) beyond the assigned shells were left unassigned`);
  } else if (regime === "shell-tunneling") {
    const built = tunnelingShells(cb);
    cbGroups.push(...built.map((shell) => shell.map((p) => [p])));
  }
  cbGroups.forEach((subgroups, i) => {
    const shell = SHELLS[i];
    const list = subgroups.flat();
    multiplets.push({
      band: "CB",
      label: shell.label,
      degeneracy: shell.degeneracy,
      peaksV: list.map((p) => p.peak.biasV),
      peakUncertaintiesV: list.map((p) => p.peak.biasUncertaintyV),
      found: list.length,
      expected: regime === "shell-filling" ? shell.degeneracy : list.length,
      subgroups: subgroups.map((g) => g.length),
    });
    if (regime === "shell-filling" && list.length < shell.degeneracy && i < cbGroups.length - 1) {
      warnings.push(`the ${shell.label} multiplet shows ${list.length} of ${shell.degeneracy} charging peaks (partly resolved)`);
    }
  });

  // Valence band groups.
  const vbGroups: Indexed[][] = [];
  for (const p of vb) {
    const last = vbGroups[vbGroups.length - 1];
    if (last && regime === "shell-filling" && ecV !== null) {
      const d = p.x - last[last.length - 1].x;
      if (Math.abs(d - ecV) <= D.valenceChargingTolerance * ecV) {
        last.push(p);
        continue;
      }
    }
    vbGroups.push([p]);
  }
  vbGroups.forEach((g, i) =>
    multiplets.push({
      band: "VB",
      label: `v${i + 1}`,
      degeneracy: null,
      peaksV: g.map((p) => p.peak.biasV),
      peakUncertaintiesV: g.map((p) => p.peak.biasUncertaintyV),
      found: g.length,
      expected: null,
      subgroups: [g.length],
    }),
  );

  // Quantities.
  const q: SpectrumQuantities = {
    gapV: null,
    chargingEnergyV: ecV,
    singleParticleGapV: null,
    levelSpacingSPV: null,
    levelSpacingPDV: null,
    valenceSpacingsV: [],
  };
  const u: SpectrumUncertainties = {
    gapV: null,
    chargingEnergyV: ecSE,
    singleParticleGapV: null,
    levelSpacingSPV: null,
    levelSpacingPDV: null,
    valenceSpacingsV: [],
  };
  const sig = (p: Indexed) => p.peak.biasUncertaintyV;
  const firstCB = cb[0];
  const firstVB = vb[0];
  if (firstCB && firstVB) {
    q.gapV = firstCB.x + firstVB.x;
    u.gapV = Math.hypot(sig(firstCB), sig(firstVB));
  } else warnings.push(`no ${firstCB ? "VB" : firstVB ? "CB" : "CB or VB"} peak: the gap between peaks is not defined`);
  const ec = ecV ?? 0;
  const ecVar = (ecSE ?? 0) ** 2;
  if (q.gapV !== null && ecV !== null) {
    q.singleParticleGapV = q.gapV - ecV;
    u.singleParticleGapV = Math.sqrt(u.gapV! ** 2 + ecVar);
  }
  const shellSpacing = (a: number, b: number): [number, number] | null => {
    const lower = cbGroups[a]?.flat();
    const upper = cbGroups[b]?.flat();
    if (!lower?.length || !upper?.length) return null;
    const last = lower[lower.length - 1], first = upper[0];
    if (regime === "shell-filling") return [first.x - last.x - ec, Math.sqrt(sig(first) ** 2 + sig(last) ** 2 + ecVar)];
    return [first.x - lower[0].x, Math.hypot(sig(first), sig(lower[0]))];
  };
  const sp = shellSpacing(0, 1);
  if (sp) [q.levelSpacingSPV, u.levelSpacingSPV] = sp;
  const pd = shellSpacing(1, 2);
  if (pd) [q.levelSpacingPDV, u.levelSpacingPDV] = pd;
  for (let i = 1; i < vbGroups.length; i++) {
    const last = vbGroups[i - 1][vbGroups[i - 1].length - 1];
    const first = vbGroups[i][0];
    const filling = regime === "shell-filling" && ecV !== null;
    q.valenceSpacingsV.push(first.x - last.x - (filling ? ec : 0));
    u.valenceSpacingsV.push(Math.sqrt(sig(first) ** 2 + sig(last) ** 2 + (filling ? ecVar : 0)));
  }
  if (regime === "shell-tunneling") warnings.push("shell tunnelling: Ec is not measurable from the CB ladder (reported as null); the gap still contains one Ec");
  if (regime === "undetermined") warnings.push("regime undetermined: CB peaks are not grouped into shells; see the evidence");

  const scale = (v: number | null) => (v === null ? null : v * eta);
  const energies: SpectrumEnergies = {
    eta,
    etaGiven,
    gapEV: scale(q.gapV),
    chargingEnergyEV: scale(q.chargingEnergyV),
    singleParticleGapEV: scale(q.singleParticleGapV),
    levelSpacingSPEV: scale(q.levelSpacingSPV),
    levelSpacingPDEV: scale(q.levelSpacingPDV),
    valenceSpacingsEV: q.valenceSpacingsV.map((v) => v * eta),
    uncertainties: {
      gapEV: scale(u.gapV),
      chargingEnergyEV: scale(u.chargingEnergyV),
      singleParticleGapEV: scale(u.singleParticleGapV),
      levelSpacingSPEV: scale(u.levelSpacingSPV),
      levelSpacingPDEV: scale(u.levelSpacingPDV),
      valenceSpacingsEV: u.valenceSpacingsV.map((v) => v * eta),
    },
  };
  return { regime, evidence, multiplets, quantities: q, uncertainties: u, energies, warnings };
}

function classify(cb: Indexed[], main: Indexed[], evidence: RegimeEvidence): Regime {
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
    if (jump === null || jump >= D.fillingJumpRatioMin) {
      reasons.push(
        `the first two CB steps are alike (ratio ${ratio.toFixed(2)} within ${D.fillingStepRatio.join("–")})` +
          (jump === null ? " and no third CB peak" : ` and the next jump is ${jump.toFixed(2)} × their spacing (≥ ${D.fillingJumpRatioMin})`) +
          ": an s doublet of charging peaks",
      );
      return "shell-filling";
    }
    reasons.push(`the first two CB steps are alike (ratio ${ratio.toFixed(2)}) but the next jump is only ${jump!.toFixed(2)} × their spacing (< ${D.fillingJumpRatioMin})`);
  } else if (ratio > D.tunnelingSatelliteRatioMax && ratio < D.fillingStepRatio[0]) {
    reasons.push(
      `the second CB step is ${ratio.toFixed(2)} × the first: too strong for a charging satellite (≤ ${D.tunnelingSatelliteRatioMax}), too weak for an s doublet (≥ ${D.fillingStepRatio[0]}): an intermediate rate ratio`,
    );
    return "undetermined";
  }
  // Shell tunnelling: the p shell (the second main peak and any sub-levels close to it) carries
  // more than the s step.
  const satellites = cb.length - main.length;
  const note = satellites ? `; ${satellites} weak peak(s) set aside as charging satellites` : "";
  const pShell = main.length >= 2 ? tunnelingShells(main)[1] : [];
  const pRatio = pShell.reduce((a, p) => a + p.peak.stepA, 0) / main[0].peak.stepA;
  if (pRatio >= D.tunnelingStepRatioMin) {
    const sub = pShell.length > 1 ? ` (${pShell.length} sub-levels together)` : "";
    reasons.push(`the p shell${sub} carries ${pRatio.toFixed(2)} × the s step (≥ ${D.tunnelingStepRatioMin}; p holds 6 electrons, s 2): single levels` + note);
    return "shell-tunneling";
  }
  reasons.push(
    `the p shell carries ${pShell.length ? pRatio.toFixed(2) : "no"} × the s step: neither an s doublet (${D.fillingStepRatio.join("–")} with a larger jump to p) nor an s/p pair (≥ ${D.tunnelingStepRatioMin})` +
      note,
  );
  return "undetermined";
}

/**
 * Splits peaks (ordered from the gap edge) into main peaks and weak ones: a peak is weak when its
 * step is below `ofMedian` × the median step of the list (noise wherever it lies, also before
 * the first level) or below `ofPrevious` × the preceding main peak's (a charging satellite).
 */
function splitSatellites(list: Indexed[], ofMedian: number, ofPrevious: number): { main: Indexed[]; satellites: Indexed[] } {
  const main: Indexed[] = [];
  const satellites: Indexed[] = [];
  const steps = list.map((p) => p.peak.stepA).sort((a, b) => a - b);
  const typical = steps.length ? steps[steps.length >> 1] : 0;
  for (const p of list) {
    const prev = main[main.length - 1];
    const weak = p.peak.stepA < ofMedian * typical || (prev !== undefined && p.peak.stepA < ofPrevious * prev.peak.stepA);
    (weak ? satellites : main).push(p);
  }
  return { main, satellites };
}

function fillingShells(cb: Indexed[]): { shells: Indexed[][][]; leftover: Indexed[]; offLadder: Indexed[] } {
  const D = ASSIGN_DEFAULTS;
  const shells: Indexed[][][] = [[cb.slice(0, 2)]];
  const ec0 = cb[1].x - cb[0].x;
  const offLadder: Indexed[] = [];
  let spExcess: number | null = null;
  let last = cb[1];
  let i = 2;
  for (let s = 1; s < SHELLS.length && i < cb.length; s++) {
    const g = SHELLS[s].degeneracy;
    // 1. Candidates: peaks up to the jump that opens the next shell (or the end of the data).
    //    Successive charging peaks lie at least Ec apart; a peak much closer to the previous one
    //    is not on the ladder.
    const run: Indexed[] = [];
    let prev = last;
    let excess = spExcess;
    let k = i;
    for (; k < cb.length; k++) {
      const d = cb[k].x - prev.x;
      if (d < D.minLadderSpacingFraction * ec0) {
        offLadder.push(cb[k]);
        continue;
      }
      if (run.length === 0) {
        // The shell's level entered early (its charging satellite) sits one Ec before the
        // shell's first peak and is much weaker: it must not set the s→p jump.
        const next = cb[k + 1];
        if (next && next.x - cb[k].x < (1 + D.subgroupExtraMin) * ec0 && cb[k].peak.stepA < D.satelliteStepRatioMax * next.peak.stepA) {
          offLadder.push(cb[k]);
          continue;
        }
        excess ??= d - ec0;
      } else if (excess !== null && excess > 0 && d - ec0 > D.newShellExcessFraction * excess) break;
      run.push(cb[k]);
      prev = cb[k];
    }
    // 2. More candidates than the shell holds: the weak extras are charging satellites (a level
    //    entered before the previous one is full); otherwise the shell ends after g peaks.
    let members = run;
    if (members.length > g && members[0].peak.stepA < D.satelliteStepRatioMax * members[1].peak.stepA) {
      // Steps fall along a charging multiplet (each added electron leaves faster), so a weak
      // first peak followed by a much stronger one is the shell's level entered early.
      offLadder.push(members[0]);
      members = members.slice(1);
    }
    if (members.length > g) {
      const steps = members.map((p) => p.peak.stepA).sort((a, b) => a - b);
      const typical = steps[steps.length >> 1];
      const byWeakness = [...members].sort((a, b) => a.peak.stepA - b.peak.stepA);
      const extras = byWeakness.slice(0, members.length - g).filter((p) => p.peak.stepA < D.leadingSatelliteRatioMax * typical);
      if (extras.length === members.length - g) {
        offLadder.push(...extras);
        members = members.filter((p) => !extras.includes(p));
      } else members = members.slice(0, g);
    }
    if (!members.length) break;
    const end = members[members.length - 1];
    // 3. Sub-groups: a spacing above (1 + subgroupExtraMin)·Ec inside the shell.
    const subgroups: Indexed[][] = [[members[0]]];
    for (let j = 1; j < members.length; j++) {
      if (members[j].x - members[j - 1].x > (1 + D.subgroupExtraMin) * ec0) subgroups.push([members[j]]);
      else subgroups[subgroups.length - 1].push(members[j]);
    }
    shells.push(subgroups);
    spExcess ??= members[0].x - last.x - ec0;
    last = end;
    i = cb.indexOf(end) + 1;
  }
  return { shells, leftover: cb.slice(i), offLadder: [...new Set(offLadder)].filter((p) => p.x < last.x).sort((a, b) => a.x - b.x) };
}

function tunnelingShells(main: Indexed[]): Indexed[][] {
  const shells: Indexed[][] = [[main[0]]];
  if (main.length < 2) return shells;
  const sp = main[1].x - main[0].x;
  shells.push([main[1]]);
  for (let i = 2; i < main.length && shells.length <= SHELLS.length; i++) {
    const d = main[i].x - main[i - 1].x;
    const shell = shells[shells.length - 1];
    if (d < ASSIGN_DEFAULTS.tunnelingSublevelFraction * sp && shells.length > 1) shell.push(main[i]);
    else if (shells.length < SHELLS.length) shells.push([main[i]]);
    else break;
  }
  return shells;
}
