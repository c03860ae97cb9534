/**
 * Conduction-band peaks grouped into shells: charging multiplets in shell filling, single levels
 * in shell tunnelling.
 */
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { BandPeak } from "./bandPeaks.ts";

/** The shells of the conduction band, in filling order, with their degeneracy (spin included). */
export const SHELLS = Object.freeze([
  Object.freeze({ label: "s", degeneracy: 2 }),
  Object.freeze({ label: "p", degeneracy: 6 }),
  Object.freeze({ label: "d", degeneracy: 10 }),
  Object.freeze({ label: "f", degeneracy: 14 }),
] as const);

/** Result of {@link fillingShells}. */
export interface FillingShells {
  /** Per shell (s, p, d, … in order), its sub-groups, each a run of charging peaks. */
  shells: BandPeak[][][];
  /** CB peaks after the last assigned shell. */
  leftover: BandPeak[];
  /** Peaks set aside as off the charging ladder (satellites), sorted by |bias|. */
  offLadder: BandPeak[];
}

/**
 * Group the CB peaks of a shell-filling spectrum into charging multiplets.
 *
 * Parameters
 * ----------
 * cb : readonly BandPeak[]
 *     The CB peaks left after the noise rule, from the gap edge outward; at least two (the s
 *     doublet).
 * pGiven : ReadonlySet<number>, optional
 *     Peak indices that make p whatever notes 1–4 would read (a p read as spin pairs,
 *     `spinPairSet`); the other peaks up to p's last are set aside, the shells after p are read
 *     as usual, and the sub-groups follow note 5.
 *
 * Returns
 * -------
 * FillingShells
 *     The shells with their sub-groups, the peaks beyond them and the peaks set aside.
 *
 * Notes
 * -----
 * 1. s = the first two peaks; their spacing is the first estimate of Ec (in bias).
 * 2. For each further shell (p, d, f with g = 6, 10, 14): candidates are the peaks up to the
 *    jump that opens the next shell, a jump whose excess over Ec is more than
 *    `ASSIGN_DEFAULTS.newShellExcessFraction` × the s→p excess. A peak closer than
 *    `minLadderSpacingFraction`·Ec to the previous charging peak is off the ladder. A first
 *    candidate within (1 + `subgroupExtraMin`)·Ec of the next on the ladder (past weaker peaks
 *    closer than `minLadderSpacingFraction`·Ec; else the next peak) and weaker than
 *    `leadingSatelliteRatioMax` × its step is the shell's level entered early (before the shell
 *    below is full; about half the next step near Γtip/Γsub = 1.5) and does not set the s→p jump.
 * 3. More candidates than g: a first candidate weaker than `satelliteStepRatioMax` × the second
 *    is set aside (steps fall along a charging multiplet); then, if every extra is weaker than
 *    `leadingSatelliteRatioMax` × the candidates' median step (a dip: × the larger of its
 *    neighbours, and below `dipTypicalRatioMax` × the median step), the extras are set aside,
 *    otherwise the shell takes its first g candidates. The extras are the dips first (a step
 *    below both neighbours: a higher sub-level entered at a lower charge state, as near
 *    Γtip/Γsub = 2–4 in a split p shell), then the weakest peaks.
 * 4. A peak inside the shell whose step is below `satelliteStepRatioMax` × the steps of both its
 *    neighbours is set aside (a higher sub-level entered at a lower charge state: not a charging
 *    peak of the ladder).
 * 5. Inside a shell, a spacing above (1 + `subgroupExtraMin`)·Ec starts a sub-group (a
 *    multiplet split by shape anisotropy).
 * 6. Peaks set aside beyond the last assigned peak are not reported as off the ladder.
 *
 * Example
 * -------
 * ```ts
 * // s at 0.6875, 0.8125 V; p from 1.3125 V in steps of 0.125 V (ε_s = 0.5, ε_p = 0.8 eV,
 * // Ec = 0.1 eV, η = 0.8), equal steps.
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: x, stepA: 1e-11 } as Peak });
 * const ladder = [0.6875, 0.8125, 1.3125, 1.4375, 1.5625, 1.6875, 1.8125, 1.9375].map(at);
 * const r = fillingShells(ladder);
 * r.shells.map((s) => s.flat().map((p) => p.index));  // => [[0, 1], [2, 3, 4, 5, 6, 7]]
 * ```
 */
export function fillingShells(cb: readonly BandPeak[], pGiven?: ReadonlySet<number>): FillingShells {
  const D = ASSIGN_DEFAULTS;
  // Fewer than two peaks make no charging ladder: an s shell of what there is, nothing else.
  if (cb.length < 2) return { shells: cb.length ? [[cb.slice()]] : [], offLadder: [], leftover: [] };
  const shells: BandPeak[][][] = [[cb.slice(0, 2)]];
  const ec0 = cb[1].x - cb[0].x;
  const offLadder: BandPeak[] = [];
  let spExcess: number | null = null;
  let last = cb[1];
  let i = 2;
  for (let s = 1; s < SHELLS.length && i < cb.length; s++) {
    const g = SHELLS[s].degeneracy;
    // 1. Candidates: peaks up to the jump that opens the next shell (or the end of the data).
    //    Successive charging peaks lie at least Ec apart; a peak much closer to the previous one
    //    is not on the ladder.
    if (s === 1 && pGiven) {
      const given = cb.filter((p) => pGiven.has(p.index));
      if (!given.length) break;
      const end = given[given.length - 1];
      offLadder.push(...cb.slice(i, cb.indexOf(end)).filter((p) => !pGiven.has(p.index)));
      shells.push(subgroupsOf(given, ec0));
      spExcess = given[0].x - last.x - ec0;
      last = end;
      i = cb.indexOf(end) + 1;
      continue;
    }
    const run: BandPeak[] = [];
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
        // shell's first peak and is much weaker: it must not set the s→p jump. Its next peak on
        // the ladder, past weaker peaks closer than the ladder's spacing (side channels off the
        // ladder); a stronger close peak is the next one (the same step found twice).
        const onLadder = cb.findIndex((q, j) => j > k && q.x - cb[k].x >= D.minLadderSpacingFraction * ec0);
        const between = cb.slice(k + 1, onLadder < 0 ? cb.length : onLadder);
        const next = between.every((q) => q.peak.stepA < cb[k].peak.stepA) && onLadder >= 0 ? cb[onLadder] : cb[k + 1];
        if (next && next.x - cb[k].x < (1 + D.subgroupExtraMin) * ec0 && cb[k].peak.stepA < D.leadingSatelliteRatioMax * next.peak.stepA) {
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
      // A dip (a step below both neighbours, the rise after it a sub-level's own charging) is a
      // higher sub-level entered early and goes before the weakest end peak, which near the
      // filling limit is the shell's last charging peak.
      const dip = (j: number) => j > 0 && j < members.length - 1 && members[j].peak.stepA < Math.min(members[j - 1].peak.stepA, members[j + 1].peak.stepA);
      const byWeakness = members
        .map((p, j) => ({ p, dip: dip(j) }))
        .sort((a, b) => Number(b.dip) - Number(a.dip) || a.p.peak.stepA - b.p.peak.stepA)
        .map((x) => x.p);
      // A dip is weak next to the larger of its neighbours and below `dipTypicalRatioMax` × the
      // median step (a step next to a strong resonance is not a dip); any other extra is weak next
      // to the median step.
      const weak = (p: BandPeak) => {
        const j = members.indexOf(p);
        if (!dip(j)) return p.peak.stepA < D.leadingSatelliteRatioMax * typical;
        const larger = Math.max(members[j - 1].peak.stepA, members[j + 1].peak.stepA);
        return p.peak.stepA < D.leadingSatelliteRatioMax * larger && p.peak.stepA < D.dipTypicalRatioMax * typical;
      };
      const extras = byWeakness.slice(0, members.length - g).filter(weak);
      if (extras.length === members.length - g) {
        offLadder.push(...extras);
        members = members.filter((p) => !extras.includes(p));
      } else members = members.slice(0, g);
    }
    // An inner peak much weaker than both neighbours is not a charging peak of the shell but a
    // channel through a higher sub-level opening at a charge state below it (a split shell).
    const weakInner = members.filter((p, j) => j > 0 && j < members.length - 1 && p.peak.stepA < D.satelliteStepRatioMax * Math.min(members[j - 1].peak.stepA, members[j + 1].peak.stepA));
    if (weakInner.length) {
      offLadder.push(...weakInner);
      members = members.filter((p) => !weakInner.includes(p));
    }
    if (!members.length) break;
    const end = members[members.length - 1];
    shells.push(subgroupsOf(members, ec0));
    spExcess ??= members[0].x - last.x - ec0;
    last = end;
    i = cb.indexOf(end) + 1;
  }
  return { shells, leftover: cb.slice(i), offLadder: [...new Set(offLadder)].filter((p) => p.x < last.x).sort((a, b) => a.x - b.x) };
}

/** Note 5 of {@link fillingShells}: a spacing above (1 + `subgroupExtraMin`)·Ec inside a shell starts a sub-group. */
function subgroupsOf(members: readonly BandPeak[], ecV: number): BandPeak[][] {
  const subgroups: BandPeak[][] = [[members[0]]];
  for (let j = 1; j < members.length; j++) {
    if (members[j].x - members[j - 1].x > (1 + ASSIGN_DEFAULTS.subgroupExtraMin) * ecV) subgroups.push([members[j]]);
    else subgroups[subgroups.length - 1].push(members[j]);
  }
  return subgroups;
}

/**
 * Whether p's levels, by their current steps, still fall short of the whole p shell deep in shell
 * tunnelling: its first level steps at most ASSIGN_DEFAULTS.tunnelingSublevelFirstStepMax (1.3) ×
 * the s step and all of them together at most tunnelingSublevelStepMax (2.5) × (a level of g
 * states after s steps g/(2(1 + (2 + g)r)) × s). Shared by {@link tunnelingShells} and the
 * `d-near-split-p` reason of rulesDecisive.
 *
 * Parameters
 * ----------
 * sStepA : number
 *     The s level's current step, A.
 * pStepsA : readonly number[]
 *     The current steps of p's levels as read, A, from s outward (at least one).
 *
 * Returns
 * -------
 * boolean
 *
 * Example
 * -------
 * ```ts
 * stepsShortOfP(1, [1, 1]); // => true (two 2-state sub-levels)
 * ```
 */
export function stepsShortOfP(sStepA: number, pStepsA: readonly number[]): boolean {
  return pStepsA[0] <= ASSIGN_DEFAULTS.tunnelingSublevelFirstStepMax * sStepA && pStepsA.reduce((sum, v) => sum + v, 0) <= ASSIGN_DEFAULTS.tunnelingSublevelStepMax * sStepA;
}

/**
 * Group the main CB peaks of a shell-tunnelling spectrum into levels of shells.
 *
 * Parameters
 * ----------
 * main : readonly BandPeak[]
 *     The CB main peaks (noise and charging satellites set aside), from the gap edge outward; at
 *     least one.
 * stepReach : boolean, optional
 *     Whether p reaches further while its steps say it is short of six states (note 3; deep in
 *     shell tunnelling only). Default false.
 * ownStepA : (p: BandPeak) => number, optional
 *     A level's own current step, A, for note 3's steps (note 5). Default its peak's `stepA`.
 *
 * Returns
 * -------
 * BandPeak[][]
 *     Per shell (s, p, … in order) its peaks, one per level: s holds the first peak; p the
 *     second and the sub-levels after it; at most `SHELLS.length` shells.
 *
 * Notes
 * -----
 * 1. s = the first peak, p starts at the second; their distance is the s→p distance.
 * 2. A main peak closer to the previous one than `ASSIGN_DEFAULTS.tunnelingSublevelFraction` ×
 *    the s→p distance is a sub-level of the same shell (a split p); otherwise it opens the next
 *    shell. Peaks beyond the last shell are left out.
 * 3. With `stepReach` (deep in shell tunnelling: the caller found no charging satellite of s of
 *    `tunnelingDeepSatelliteMax` × its step (note 4), so Γtip/Γsub ≤ 1/9; not for the regime's own test),
 *    in p the reach is `tunnelingSublevelStepFraction` (0.75) × the s→p distance while p's first
 *    level steps at most `tunnelingSublevelFirstStepMax` (1.3) × the s step and its levels so far
 *    at most `tunnelingSublevelStepMax` (2.5) × together: a level of g states after s steps
 *    g/(2(1 + (2 + g)r)) × s (2 states ≤ 1, the whole p ≥ 1.59 at r ≤ 1/9), so p is then short of
 *    its six states, and a d shell lies at least one s→p distance above p.
 * 4. The caller counts only s's own charging satellite (between s and the next level,
 *    `ASSIGN_DEFAULTS.tunnelingDeepSatelliteOfSOnly`) for that test: the closed form r/(1 + r) is
 *    s's; a deeper level's tip-side charging peak (its second carrier may also enter a level
 *    below it) steps more, and lies beyond the next sub-level where Ec/η exceeds their spacing.
 * 5. With `ownStepA`, the steps of note 3 are a level's own: the caller
 *    (`ASSIGN_DEFAULTS.tunnelingDeepLessResonanceShare`) takes from a level lying at a VB peak's
 *    plain second-junction resonance the least share a resonance steps of its source's,
 *    (g·r + 1)/(g + r) → ½ for g = 2 as r → 0 (`SECOND_JUNCTION_DEFAULTS.ownShareSourceStepRatioMin`):
 *    the substrate side steps at that bias too (the resonance, or where the substrate side fills
 *    the band's edge resonance's second charging peak), and the merged step would read a 2-state
 *    sub-level as the whole p.
 *
 * Example
 * -------
 * ```ts
 * // Levels at 0.6875, 1.0625, 1.1 and 1.6 V: s, p (split in two), d.
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: x, stepA: 1e-11 } as Peak });
 * tunnelingShells([0.6875, 1.0625, 1.1, 1.6].map(at)).map((s) => s.length);  // => [1, 2, 1]
 * ```
 */
export function tunnelingShells(main: readonly BandPeak[], stepReach = false, ownStepA: (p: BandPeak) => number = (p) => p.peak.stepA): BandPeak[][] {
  if (main.length === 0) return [];
  const shells: BandPeak[][] = [[main[0]]];
  if (main.length < 2) return shells;
  const sp = main[1].x - main[0].x;
  shells.push([main[1]]);
  for (let i = 2; i < main.length && shells.length <= SHELLS.length; i++) {
    const d = main[i].x - main[i - 1].x;
    const shell = shells[shells.length - 1];
    // Deep in shell tunnelling, p not yet holding its six states by its steps (a level of g states
    // about g/2 × the s step): a closer peak is one more sub-level.
    const sStep = ownStepA(main[0]);
    const pShort = stepReach && shells.length === 2 && stepsShortOfP(sStep, shell.map(ownStepA));
    const reach = pShort ? ASSIGN_DEFAULTS.tunnelingSublevelStepFraction : ASSIGN_DEFAULTS.tunnelingSublevelFraction;
    if (d < reach * sp && shells.length > 1) shell.push(main[i]);
    else if (shells.length < SHELLS.length) shells.push([main[i]]);
    else break;
  }
  return shells;
}

/**
 * Complete the shells of shell filling with weak peaks that continue their charging ladders: near
 * the filling limit the last charging steps of a shell are a small fraction of its first (each
 * added carrier finds fewer free states), below the band's noise rule.
 *
 * Parameters
 * ----------
 * shells : readonly BandPeak[][][]
 *     From {@link fillingShells}: per shell its sub-groups.
 * weak : readonly BandPeak[]
 *     CB peaks set aside as weak (noise rule), from the gap edge outward.
 * chargingEnergyV : number
 *     Ec in bias, V (the ladder fit's spacing).
 *
 * Returns
 * -------
 * { shells: BandPeak[][][]; added: BandPeak[] }
 *     The shells with the peaks appended to their last sub-group, and the peaks used.
 *
 * Notes
 * -----
 * 1. Per shell from s outward, while it holds fewer peaks than its degeneracy: a weak peak within
 *    ± `ASSIGN_DEFAULTS.subgroupExtraMin`·Ec of one Ec beyond its last peak, and before the next
 *    shell's first peak by at least Ec/2, is its next charging peak.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: x, stepA: 1e-11 } as Peak });
 * const shells = [[[at(0.6875, 0), at(0.8125, 1)]], [[at(1.3125, 2), at(1.4375, 3)]]];
 * completeShells(shells, [at(1.5625, 4)], 0.125).added.map((p) => p.index);  // => [4]
 * ```
 */
export function completeShells(shells: readonly BandPeak[][][], weak: readonly BandPeak[], chargingEnergyV: number): { shells: BandPeak[][][]; added: BandPeak[] } {
  const tol = ASSIGN_DEFAULTS.subgroupExtraMin * chargingEnergyV;
  const out = shells.map((shell) => shell.map((g) => [...g]));
  const added: BandPeak[] = [];
  out.forEach((shell, s) => {
    const g = SHELLS[s]?.degeneracy ?? Infinity;
    const nextStart = out[s + 1]?.[0]?.[0]?.x ?? Infinity;
    for (let n = shell.flat().length; n < g; n++) {
      const last = shell[shell.length - 1][shell[shell.length - 1].length - 1];
      const p = weak.find((w) => !added.includes(w) && Math.abs(w.x - last.x - chargingEnergyV) <= tol && w.x <= nextStart - chargingEnergyV / 2);
      if (!p) break;
      shell[shell.length - 1].push(p);
      added.push(p);
    }
  });
  return { shells: out, added };
}
