/**
 * Steps 1–6 of `assignSpectrum` for one set of peaks set aside as second-junction resonances:
 * bands, noise and satellites, regime, CB shells and Ec, VB groups, quantities and energies.
 * The readings of steps 7–8 (`substrateReadings.ts`) call it again with other resonances.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { Assignment, AssignOptions } from "./assignSpectrum.ts";
import { bandPeaks, type BandPeak } from "./bandPeaks.ts";
import { spectrumEnergies } from "./energies.ts";
import { fitLadderSpacing } from "./ladderFit.ts";
import { levelChargingPeaks, satelliteChargingEnergy } from "./levelCharging.ts";
import { shellMultiplets, valenceMultiplets, type Multiplet } from "./multiplets.ts";
import { spectrumQuantities } from "./quantities.ts";
import { classifyRegime, extraCbPeak, regimeRatios, type Regime, type RegimeEvidence } from "./regime.ts";
import { splitSatellites } from "./satellites.ts";
import { isPlainPrediction, secondJunctionResonances, SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";
import { completeShells, fillingShells, tunnelingShells } from "./shells.ts";
import { valenceEdgePartner, valenceGroups } from "./valenceGroups.ts";
import { levelsAtDoubletResonance } from "./doubletResonance.ts";
import { leadingShoulder, LEADING_SHOULDER_DEFAULTS } from "./leadingShoulder.ts";

/**
 * The assignment with the given peaks set aside as second-junction resonances; in shell filling,
 * p made of the peaks `pGiven` names where given (`fillingShells`).
 */
export function assignWith(peaks: readonly Peak[], eta: number, etaGiven: boolean, resonances: readonly SecondJunctionResonance[], options: AssignOptions, pGiven?: ReadonlySet<number>): Assignment {
  const D = ASSIGN_DEFAULTS;
  const warnings: string[] = [];
  if (!etaGiven) warnings.push("eta not given: energies equal the bias-referred values (η = 1); pass the voltage-division factor to convert");

  // 1–2. Bands; peaks at the noise level of their band go first; charging satellites (weak peaks
  // after a main peak) are told apart only once the regime is known.
  const resonant = new Set(resonances.map((r) => r.index));
  const bands = bandPeaks(peaks);
  const cbAll = bands.cb.filter((p) => !resonant.has(p.index));
  const vbAll = bands.vb.filter((p) => !resonant.has(p.index));
  const cbNoise = splitSatellites(cbAll, D.noiseStepRatioMax, 0);
  const vbNoise = splitSatellites(vbAll, D.noiseStepRatioMax, 0);
  const cbClean = cbNoise.main;
  const cbSplit = splitSatellites(cbClean, 0, D.satelliteStepRatioMax);
  const vbSplit = splitSatellites(vbNoise.main, 0, D.satelliteStepRatioMax);
  let vb = vbSplit.main;

  // 3. Regime.
  const evidence: RegimeEvidence = { ...regimeRatios(cbClean, vb, vbNoise.main), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [...resonances], reasons: [] };
  const gain = eta < 1 ? eta / (1 - eta) : 0;
  for (const r of resonances) {
    const at = peaks[r.index].biasV.toFixed(3), source = peaks[r.sourceIndex].biasV;
    const plain = isPlainPrediction(r, source, gain);
    evidence.reasons.push(
      plain
        ? `peak at ${at} V set aside: the second-junction resonance −η·V/(1 − η) = ${r.predictedV.toFixed(3)} V of the peak at ${source.toFixed(3)} V`
        : `peak at ${at} V set aside: a second-junction resonance of the level whose first peak is at ${source.toFixed(3)} V (expected at ${r.predictedV.toFixed(3)} V)`,
    );
  }
  const regime: Regime = options.regime ?? classifyRegime(cbClean, cbSplit.main, evidence);
  const cb = regime === "shell-filling" ? cbClean : cbSplit.main;
  let setAside: BandPeak[] = [...cbNoise.satellites, ...vbNoise.satellites, ...vbSplit.satellites, ...(regime === "shell-filling" ? [] : cbSplit.satellites)];
  if (options.regime) evidence.reasons.push(`regime ${options.regime} given by the user`);

  // 4. CB shells and Ec.
  let ecV: number | null = null;
  let ecSE: number | null = null;
  const cbGroups: BandPeak[][][] = []; // per shell: its sub-groups
  if (regime === "shell-filling") {
    const built = fillingShells(cb, pGiven);
    if (built.offLadder.length) {
      setAside = [...setAside, ...built.offLadder];
      evidence.reasons.push(`${built.offLadder.length} CB peak(s) closer than ${D.minLadderSpacingFraction} × Ec to the previous charging peak set aside`);
    }
    const ladderFit = (shells: BandPeak[][][]) =>
      fitLadderSpacing(shells.flat().map((g) => ({ positionsV: g.map((p) => p.x), sigmasV: g.map((p) => p.peak.biasUncertaintyV) })));
    let shells = built.shells;
    let fit = ladderFit(shells);
    // The last charging peaks of a shell near the filling limit fall below the noise rule.
    const completed = fit ? completeShells(shells, cbNoise.satellites, fit.spacingV) : null;
    if (completed?.added.length) {
      shells = completed.shells;
      fit = ladderFit(shells);
      setAside = setAside.filter((p) => !completed.added.includes(p));
      evidence.reasons.push(`${completed.added.length} weak CB peak(s) one Ec beyond a shell's last peak taken as its next charging peak(s)`);
    }
    cbGroups.push(...shells);
    // The s doublet's second peak's resonance is weak (1/(1 + r) of the first's): a peak set aside
    // as it that steps more holds a level, and the reading is made again without it.
    const s = shells[0]?.flat().map((p) => p.index) ?? [];
    const back = levelsAtDoubletResonance(peaks, resonances, s, eta / (1 - eta));
    if (back.length) {
      const again = assignWith(peaks, eta, etaGiven, resonances.filter((r) => !back.includes(r)), options, pGiven);
      if (again.regime === "shell-filling") {
        const firstA = peaks[resonances.find((f) => f.sourceIndex === s[0])!.index].stepA;
        again.evidence.reasons.push(...back.map((r) => `peak at ${peaks[r.index].biasV.toFixed(3)} V kept as a level: it steps ${(peaks[r.index].stepA / firstA).toFixed(2)} × the first s peak's resonance, more than the second s peak's resonance carries (1/(1 + r) of it through the substrate junction)`));
        return again;
      }
    }
    if (fit) {
      ecV = fit.spacingV;
      ecSE = fit.spacingSEV;
    }
    if (built.leftover.length) warnings.push(`${built.leftover.length} CB peak(s) beyond the assigned shells were left unassigned`);
  } else if (regime === "shell-tunneling") {
    // Near the crossover a level charges; a charging satellite of a gap-edge level gives Ec. Not
    // with a regime given: that asks for single levels (the model fit's single-level hypothesis).
    // An extra peak between s and p that the rules read as no level (`extraCbPeak`) goes the way
    // of a weaker one, which is a charging satellite of s; being no charging peak, it gives no Ec.
    const extra = options.regime ? null : extraCbPeak(cbClean, evidence);
    const cbCharging = extra ? { main: cbSplit.main, satellites: cbSplit.satellites.filter((p) => p !== extra) } : cbSplit;
    const satelliteEc = options.regime ? null : satelliteChargingEnergy([cbCharging, vbSplit]);
    const tip = extra && cb.includes(extra) ? cb.filter((p) => p !== extra) : cb;
    if (tip !== cb) {
      setAside = [...setAside, extra!];
      evidence.reasons.push(`CB peak at ${extra!.peak.biasV.toFixed(3)} V set aside: the extra peak between s and p, no level of the ladder`);
    }
    // A weak first peak within a width of the next is a fragment of that peak, not s
    // (`leadingShoulder`); not with a regime given, as for the extra peak.
    let levels = tip;
    const shoulder = options.regime ? null : leadingShoulder(tip);
    if (shoulder) {
      levels = tip.filter((p) => p !== shoulder);
      setAside = [...setAside, shoulder];
      evidence.reasons.push(`CB peak at ${shoulder.peak.biasV.toFixed(3)} V set aside: a weak shoulder of the next CB peak (within one FWHM, below ${LEADING_SHOULDER_DEFAULTS.stepRatioMax} × its step), no level`);
    }
    if (satelliteEc !== null) {
      ecV = satelliteEc.chargingEnergyV;
      ecSE = satelliteEc.sigmaV;
      const split = levelChargingPeaks(levels, ecV);
      if (split.charging.length) {
        levels = split.levels;
        setAside = [...setAside, ...split.charging];
        evidence.reasons.push(`${split.charging.length} CB peak(s) one Ec (${ecV.toFixed(3)} V, from a charging satellite) after the peak before them set aside as charging peaks of that level`);
      }
    }
    // Deep in the regime (no charging satellite of s of 0.1 × its step: Γtip/Γsub ≤ 1/9) p's steps
    // tell a split p from a whole one. Only s's own satellite (before the next level) follows the
    // closed form r/(1 + r): a deeper level's charging peak also takes the carrier of any level
    // below it, and steps more.
    const sSatelliteEndX = D.tunnelingDeepSatelliteOfSOnly ? (levels[1]?.x ?? Infinity) : Infinity;
    const deep = levels.length > 0 && !cbSplit.satellites.some((p) => p.x < sSatelliteEndX && p.peak.stepA >= D.tunnelingDeepSatelliteMax * levels[0].peak.stepA);
    // A level at a VB peak's plain resonance also holds a substrate-side step: p's steps are
    // judged less the least share a resonance takes of its source's (note 5 of tunnelingShells).
    const shared = deep && D.tunnelingDeepLessResonanceShare ? new Map(secondJunctionResonances(peaks, eta).map((r) => [r.index, r.sourceIndex])) : new Map<number, number>();
    const ownStepA = (p: BandPeak) => {
      const source = shared.get(p.index);
      return source === undefined ? p.peak.stepA : Math.max(0, p.peak.stepA - SECOND_JUNCTION_DEFAULTS.ownShareSourceStepRatioMin * Math.max(0, peaks[source].stepA));
    };
    cbGroups.push(...tunnelingShells(levels, deep, ownStepA).map((shell) => shell.map((p) => [p])));
  }
  const satellites = [...setAside].sort((a, b) => a.peak.biasV - b.peak.biasV);
  evidence.satellitePeaksV = satellites.map((p) => p.peak.biasV);
  evidence.satellitePeakIndices = satellites.map((p) => p.index);

  // 5. Multiplets: CB shells, then VB groups; a VB gap-edge level of one peak takes its partner
  // from the resonances (spin: two carriers per level).
  let vbGroups = valenceGroups(vb, ecV, regime);
  const partner = regime === "shell-filling" && ecV !== null ? valenceEdgePartner(vbGroups, bands.vb.filter((p) => resonant.has(p.index)), ecV) : null;
  if (partner) {
    vbGroups = [[partner, ...vbGroups[0]], ...vbGroups.slice(1)];
    vb = [partner, ...vb];
    evidence.secondJunction = evidence.secondJunction.filter((r) => r.index !== partner.index);
    const at = `peak at ${partner.peak.biasV.toFixed(3)} V`;
    evidence.reasons = evidence.reasons.filter((r) => !r.startsWith(`${at} set aside`));
    evidence.reasons.push(`${at} kept as the VB edge level's first charging peak: the edge level read as one peak lacks one (spin puts two carriers on every level), and this one lies one Ec nearer the gap; a second-junction resonance shares it`);
  }
  const multiplets: Multiplet[] = [...shellMultiplets(cbGroups, regime, warnings), ...valenceMultiplets(vbGroups)];

  // 6. Quantities and energies.
  const { quantities, uncertainties } = spectrumQuantities({ regime, cb, vb, cbGroups, vbGroups, chargingEnergyV: ecV, chargingEnergySEV: ecSE }, warnings);
  if (regime === "shell-tunneling") {
    warnings.push(
      ecV === null
        ? "shell tunnelling: Ec is not measurable from the CB ladder (reported as null); the gap still contains one Ec"
        : "shell tunnelling: Ec is the spacing of a gap-edge level and its charging satellite (one pair of peaks, not a ladder fit); the gap contains one Ec",
    );
  }
  if (regime === "undetermined") warnings.push("regime undetermined: CB peaks are not grouped into shells; see the evidence");
  const energies = spectrumEnergies(quantities, uncertainties, eta, etaGiven);
  return { regime, evidence, multiplets, quantities, uncertainties, energies, noLevels: null, warnings };
}
