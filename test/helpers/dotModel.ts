// A DotModel with the settings most model tests share (Ec 0.1 eV, η 0.8, Γtip 1e9/s, Γsub 1e8/s,
// fast relaxation, 4.5 K) and no levels unless given.
import type { DotModel } from "../../lib/model/bandCurrent.ts";

export function dotModel(partial: Partial<DotModel>): DotModel {
  return {
    cb: [],
    vb: [],
    chargingEnergyEV: 0.1,
    eta: 0.8,
    tipRatePerS: 1e9,
    substrateRatePerS: 1e8,
    relaxationRatePerS: 1e12,
    temperatureK: 4.5,
    ...partial,
  };
}
