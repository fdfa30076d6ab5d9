/** The named heat-capacity models. */
import { InputError } from "../errors";
import { sommerfeld, sommerfeldT5, sommerfeldT7 } from "./sommerfeld";
import { nuclear } from "./nuclear";
import { magnon } from "./magnon";
import { debye } from "./debye";
import { einstein } from "./einstein";
import { schottky } from "./schottky";
import { bcs } from "./bcs";
import { alphaModel } from "./alphaModel";
import type { HeatCapacityModel } from "./types";

export const MODELS: Readonly<Record<string, HeatCapacityModel>> = Object.freeze(
  Object.fromEntries([sommerfeld, sommerfeldT5, sommerfeldT7, nuclear, magnon, debye, einstein, schottky, bcs, alphaModel].map((m) => [m.name, m])),
);

/** The registered model called `name`; InputError listing the names otherwise. */
export function getModel(name: string): HeatCapacityModel {
  const m = Object.hasOwn(MODELS, name) ? MODELS[name] : undefined;
  if (!m) throw new InputError(`invalid model: ${JSON.stringify(name)} (known: ${Object.keys(MODELS).join(", ")})`, { field: "model" });
  return m;
}
