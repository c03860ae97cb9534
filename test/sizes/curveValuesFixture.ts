// Builds the per-curve analysis values that combineCurves and sizeSeries read, from a few
// numbers, for tests of the combination (plumbing: values by construction, not measurements).
import type { CurveValues } from "../../lib/sizes/combineCurves.ts";

export interface ValuesSpec {
  /** Gap, V. */
  gapV: number;
  chargingEnergyV?: number | null;
  levelSpacingSPV?: number | null;
  valenceSpacingsV?: number[];
  /** 1σ of every bias value, V. Default 0.001. */
  sigmaV?: number;
  eta?: number;
  regime?: CurveValues["regime"];
}

/** CurveValues whose energies are η × the bias values (the project's convention). */
export function curveValues(spec: ValuesSpec): CurveValues {
  const eta = spec.eta ?? 0.8;
  const s = spec.sigmaV ?? 0.001;
  const ec = spec.chargingEnergyV ?? null;
  const sp = spec.levelSpacingSPV ?? null;
  const vs = spec.valenceSpacingsV ?? [];
  const single = ec === null ? null : spec.gapV - ec;
  const e = (v: number | null) => (v === null ? null : eta * v);
  return {
    regime: spec.regime ?? (ec === null ? "shell-tunneling" : "shell-filling"),
    gapV: spec.gapV,
    chargingEnergyV: ec,
    singleParticleGapV: single,
    levelSpacingSPV: sp,
    valenceSpacingsV: vs,
    uncertainties: {
      gapV: s,
      chargingEnergyV: ec === null ? null : s,
      singleParticleGapV: single === null ? null : s,
      levelSpacingSPV: sp === null ? null : s,
      levelSpacingPDV: null,
      valenceSpacingsV: vs.map(() => s),
    },
    energies: {
      eta,
      etaGiven: spec.eta !== undefined,
      gapEV: e(spec.gapV),
      chargingEnergyEV: e(ec),
      singleParticleGapEV: e(single),
      levelSpacingSPEV: e(sp),
      levelSpacingPDEV: null,
      valenceSpacingsEV: vs.map((v) => eta * v),
      uncertainties: {
        gapEV: eta * s,
        chargingEnergyEV: ec === null ? null : eta * s,
        singleParticleGapEV: single === null ? null : eta * s,
        levelSpacingSPEV: sp === null ? null : eta * s,
        levelSpacingPDEV: null,
        valenceSpacingsEV: vs.map(() => eta * s),
      },
    },
  };
}
