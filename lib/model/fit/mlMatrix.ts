/**
 * ml-matrix for the fit's linear algebra, loaded at the first fit rather than at start-up (see
 * lazyModule): `const { Matrix, solve } = mlMatrix();`.
 */
import type * as MlMatrix from "ml-matrix";
import { lazyModule } from "../../util/lazyModule.ts";

/** Returns the ml-matrix module (loaded on the first call in Node). */
export const mlMatrix = await lazyModule<typeof MlMatrix>("ml-matrix", "commonjs", () => import("ml-matrix"));
