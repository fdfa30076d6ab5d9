/**
 * The one mathjs instance used for physical units in the engine. mathjs knows SI units
 * with prefixes, tesla, mole and gram; two CGS field units are added here:
 *
 *   oersted (Oe, kOe, …) = 1000/(4π) A/m exactly — a magnetic field strength H;
 *   gauss   (G, kG, …)   = 1e-4 T exactly        — a flux density B.
 *
 * These definitions are the CGS–SI correspondences (see e.g. the SI Brochure, 9th ed., 2019,
 * on non-SI units, and any electromagnetism textbook).
 */
import { all, create } from "mathjs";
import type { Unit } from "mathjs";

export const unitMath = create(all, {});

unitMath.createUnit("oersted", { definition: `${1000 / (4 * Math.PI)} A/m`, aliases: ["Oe"], prefixes: "short" });
unitMath.createUnit("gauss", { definition: "1e-4 T", aliases: ["G"], prefixes: "short" });

export type { Unit };
