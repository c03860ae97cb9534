/**
 * A shell past p that opens too close to the full shell below: its leading peaks are not the new
 * shell's charging peaks.
 */
import type { Assignment } from "./assignSpectrum.ts";
import type { Multiplet } from "./multiplets.ts";
import { SHELLS } from "./shells.ts";
import { spectrumEnergies } from "./energies.ts";
import { spacingLessCharging } from "./quantities.ts";

/** Defaults of {@link withoutCloseShellPeaks}. */
export const CLOSE_SHELL_DEFAULTS = Object.freeze({
  /**
   * A shell past p (d, f) opens at least this × Ec (in bias) beyond the last charging peak of the
   * shell below: its first carrier pays Ec and the orbital spacing (addition energy Ec + Δ,
   * Δ > 0). A nearer leading peak is left out of the shell. Chosen on the accuracy benchmark
   * (low η, where such a peak just past a full p is a substrate-junction resonance).
   */
  openingSpacingMin: 1,
});

/**
 * A shell-filling assignment with the leading peaks of its shells past p left out where they lie
 * closer than `CLOSE_SHELL_DEFAULTS.openingSpacingMin` × Ec to the last peak of the shell below.
 *
 * Parameters
 * ----------
 * a : Assignment
 *     A reading of `assignSpectrum`.
 *
 * Returns
 * -------
 * Assignment
 *     `a` itself when it is not shell filling, has no Ec, or no shell past p opens too close;
 *     otherwise a copy whose shell loses those peaks (a shell left empty is dropped and the next
 *     takes its label), with Δpd
 *     from the shell's new first peak (null without one) and a reason per peak left out.
 *
 * Notes
 * -----
 * 1. Tip side in shell filling: the last carrier of a full shell enters at η·V = ε + Ec·(N − ½)
 *    and the next shell's first at ε′ + Ec·(N + ½), ε′ − ε = Δ > 0 (orthodox theory): the
 *    spacing in bias is (Ec + Δ)/η, more than Ec_V = Ec/η. A shorter one gives Δ ≤ 0, no shell.
 * 2. Only shells past p: the s→p step is read by the shell rules themselves (a level entered
 *    early, `fillingShells` note 2), and p's first peak is where the ladder's readings start.
 * 3. The peak is left out, not given another role: at low η it is mostly a substrate-junction
 *    resonance of a VB level (or the same step found twice beside one), but nothing here tells.
 *
 * Example
 * -------
 * ```ts
 * // Used by analyzeCurve on its final reading; see test/assign/closeShell.test.ts for constructed
 * // ladders (Ec_V = 0.125 V: a "d" peak 0.7 Ec_V past p's last is left out, d dropped).
 * withoutCloseShellPeaks(analysis.assignment).multiplets.map((m) => m.label);  // => ["s", "p", "v1"]
 * ```
 */
export function withoutCloseShellPeaks(a: Assignment): Assignment {
  const ecV = a.quantities.chargingEnergyV;
  if (a.regime !== "shell-filling" || ecV === null || !(ecV > 0)) return a;
  const cb = a.multiplets.filter((m) => m.band === "CB");
  const reasons: string[] = [];
  // Each shell past p against the last shell kept below it; a shell emptied gives its place (and
  // label) to the next.
  const shells: Multiplet[] = cb.slice(0, 2);
  let changed = false;
  for (const m of cb.slice(2)) {
    const below = shells[shells.length - 1];
    if (!below.peaksV.length) {
      shells.push(m);
      continue;
    }
    const lastV = Math.abs(below.peaksV[below.peaksV.length - 1]);
    let drop = 0;
    while (drop < m.peaksV.length && Math.abs(m.peaksV[drop]) - lastV < CLOSE_SHELL_DEFAULTS.openingSpacingMin * ecV) {
      reasons.push(`peak at ${m.peaksV[drop].toFixed(3)} V left out of ${m.label}: ${(Math.abs(m.peaksV[drop]) - lastV).toFixed(3)} V beyond ${below.label}'s last peak, less than ${CLOSE_SHELL_DEFAULTS.openingSpacingMin} × Ec (${ecV.toFixed(3)} V; a new shell opens Ec plus its orbital spacing beyond)`);
      drop++;
    }
    const shell = SHELLS[shells.length];
    if (drop) changed = true;
    if (drop === m.peaksV.length) continue;
    const kept = drop ? trimmed(m, drop) : m;
    shells.push(kept.label === shell.label ? kept : { ...kept, label: shell.label, degeneracy: shell.degeneracy, expected: shell.degeneracy });
  }
  if (!changed) return a;
  const multiplets = [...shells, ...a.multiplets.filter((m) => m.band !== "CB")];
  const p = multiplets.find((m) => m.band === "CB" && m.label === "p");
  const d = multiplets.find((m) => m.band === "CB" && m.label === "d");
  const quantities = { ...a.quantities, levelSpacingPDV: null as number | null };
  const uncertainties = { ...a.uncertainties, levelSpacingPDV: null as number | null };
  if (p?.peaksV.length && d?.peaksV.length) {
    const k = p.peaksV.length - 1;
    [quantities.levelSpacingPDV, uncertainties.levelSpacingPDV] = spacingLessCharging(
      Math.abs(p.peaksV[k]), p.peakUncertaintiesV[k], Math.abs(d.peaksV[0]), d.peakUncertaintiesV[0], ecV, a.uncertainties.chargingEnergyV ?? 0);
  }
  return {
    ...a,
    multiplets,
    quantities,
    uncertainties,
    energies: spectrumEnergies(quantities, uncertainties, a.energies.eta, a.energies.etaGiven),
    evidence: { ...a.evidence, reasons: [...a.evidence.reasons, ...reasons] },
  };
}

/** The multiplet without its first `drop` peaks (its first sub-groups shortened). */
function trimmed(m: Multiplet, drop: number): Multiplet {
  const subgroups: number[] = [];
  let left = drop;
  for (const size of m.subgroups) {
    const cut = Math.min(size, left);
    left -= cut;
    if (size - cut > 0) subgroups.push(size - cut);
  }
  return {
    ...m,
    peakIndices: m.peakIndices.slice(drop),
    peaksV: m.peaksV.slice(drop),
    peakUncertaintiesV: m.peakUncertaintiesV.slice(drop),
    found: m.found - drop,
    subgroups,
  };
}
