/**
 * Elements H–Og with standard atomic weights.
 *
 * Source: IUPAC/CIAAW, "Standard atomic weights of the elements 2021 (IUPAC Technical Report)",
 * T. Prohaska et al., Pure Appl. Chem. 94, 573–600 (2022) — the ABRIDGED table (five significant
 * figures at most, with its ± values). The values were typed FROM MEMORY of that abridged table,
 * not read from a copy of it; the common metals of this field (Cu 63.546, Al 26.982, Nb 92.906,
 * Mo 95.95, Ti 47.867, V 50.942, Fe 55.845, Ni 58.693, Pd 106.42, Pt 195.08 …) were checked twice.
 * The least certain entries are the ± values of some lanthanides and the bracketed mass numbers
 * of the heaviest elements; confirm against the published table before citing them.
 *
 * kind:
 *   "standard"   a single standard atomic weight;
 *   "interval"   IUPAC gives an interval [a, b] (H, Li, B, C, N, O, Mg, Si, S, Cl, Ar, Br, Tl, Pb);
 *                the abridged / conventional value is used, as IUPAC recommends for general use;
 *   "no-stable"  no stable isotope and no standard atomic weight: the mass number of the
 *                longest-lived isotope, shown in brackets per IUPAC practice (e.g. Tc [97]); the
 *                uncertainty is null and results using it are flagged.
 */

export type AtomicWeightKind = "standard" | "interval" | "no-stable";

export interface Element {
  readonly z: number;
  readonly symbol: string;
  readonly name: string;
  /** g/mol (numerically the relative atomic mass A_r). */
  readonly atomicWeight: number;
  /** The abridged table's ± value in g/mol; null for "no-stable". */
  readonly uncertainty: number | null;
  readonly kind: AtomicWeightKind;
}

type Row = [string, string, number, number | null, ("i" | "r")?];

// Z = index + 1. [symbol, name, weight, ±, i = interval / r = no stable isotope]
const ROWS: Row[] = [
  ["H", "hydrogen", 1.008, 0.0002, "i"], ["He", "helium", 4.0026, 0.0001], ["Li", "lithium", 6.94, 0.06, "i"],
  ["Be", "beryllium", 9.0122, 0.0001], ["B", "boron", 10.81, 0.02, "i"], ["C", "carbon", 12.011, 0.002, "i"],
  ["N", "nitrogen", 14.007, 0.001, "i"], ["O", "oxygen", 15.999, 0.001, "i"], ["F", "fluorine", 18.998, 0.001],
  ["Ne", "neon", 20.18, 0.001], ["Na", "sodium", 22.99, 0.001], ["Mg", "magnesium", 24.305, 0.002, "i"],
  ["Al", "aluminium", 26.982, 0.001], ["Si", "silicon", 28.085, 0.001, "i"], ["P", "phosphorus", 30.974, 0.001],
  ["S", "sulfur", 32.06, 0.02, "i"], ["Cl", "chlorine", 35.45, 0.01, "i"], ["Ar", "argon", 39.95, 0.16, "i"],
  ["K", "potassium", 39.098, 0.001], ["Ca", "calcium", 40.078, 0.004], ["Sc", "scandium", 44.956, 0.001],
  ["Ti", "titanium", 47.867, 0.001], ["V", "vanadium", 50.942, 0.001], ["Cr", "chromium", 51.996, 0.001],
  ["Mn", "manganese", 54.938, 0.001], ["Fe", "iron", 55.845, 0.002], ["Co", "cobalt", 58.933, 0.001],
  ["Ni", "nickel", 58.693, 0.001], ["Cu", "copper", 63.546, 0.003], ["Zn", "zinc", 65.38, 0.02],
  ["Ga", "gallium", 69.723, 0.001], ["Ge", "germanium", 72.63, 0.008], ["As", "arsenic", 74.922, 0.001],
  ["Se", "selenium", 78.971, 0.008], ["Br", "bromine", 79.904, 0.003, "i"], ["Kr", "krypton", 83.798, 0.002],
  ["Rb", "rubidium", 85.468, 0.001], ["Sr", "strontium", 87.62, 0.01], ["Y", "yttrium", 88.906, 0.001],
  ["Zr", "zirconium", 91.224, 0.002], ["Nb", "niobium", 92.906, 0.001], ["Mo", "molybdenum", 95.95, 0.01],
  ["Tc", "technetium", 97, null, "r"], ["Ru", "ruthenium", 101.07, 0.02], ["Rh", "rhodium", 102.91, 0.01],
  ["Pd", "palladium", 106.42, 0.01], ["Ag", "silver", 107.87, 0.01], ["Cd", "cadmium", 112.41, 0.01],
  ["In", "indium", 114.82, 0.01], ["Sn", "tin", 118.71, 0.01], ["Sb", "antimony", 121.76, 0.01],
  ["Te", "tellurium", 127.6, 0.03], ["I", "iodine", 126.9, 0.01], ["Xe", "xenon", 131.29, 0.01],
  ["Cs", "caesium", 132.91, 0.01], ["Ba", "barium", 137.33, 0.01], ["La", "lanthanum", 138.91, 0.01],
  ["Ce", "cerium", 140.12, 0.01], ["Pr", "praseodymium", 140.91, 0.01], ["Nd", "neodymium", 144.24, 0.01],
  ["Pm", "promethium", 145, null, "r"], ["Sm", "samarium", 150.36, 0.02], ["Eu", "europium", 151.96, 0.01],
  ["Gd", "gadolinium", 157.25, 0.03], ["Tb", "terbium", 158.93, 0.01], ["Dy", "dysprosium", 162.5, 0.01],
  ["Ho", "holmium", 164.93, 0.01], ["Er", "erbium", 167.26, 0.01], ["Tm", "thulium", 168.93, 0.01],
  ["Yb", "ytterbium", 173.05, 0.02], ["Lu", "lutetium", 174.97, 0.01], ["Hf", "hafnium", 178.49, 0.01],
  ["Ta", "tantalum", 180.95, 0.01], ["W", "tungsten", 183.84, 0.01], ["Re", "rhenium", 186.21, 0.01],
  ["Os", "osmium", 190.23, 0.03], ["Ir", "iridium", 192.22, 0.01], ["Pt", "platinum", 195.08, 0.02],
  ["Au", "gold", 196.97, 0.01], ["Hg", "mercury", 200.59, 0.01], ["Tl", "thallium", 204.38, 0.01, "i"],
  ["Pb", "lead", 207.2, 1.1, "i"], ["Bi", "bismuth", 208.98, 0.01], ["Po", "polonium", 209, null, "r"],
  ["At", "astatine", 210, null, "r"], ["Rn", "radon", 222, null, "r"], ["Fr", "francium", 223, null, "r"],
  ["Ra", "radium", 226, null, "r"], ["Ac", "actinium", 227, null, "r"], ["Th", "thorium", 232.04, 0.01],
  ["Pa", "protactinium", 231.04, 0.01], ["U", "uranium", 238.03, 0.01], ["Np", "neptunium", 237, null, "r"],
  ["Pu", "plutonium", 244, null, "r"], ["Am", "americium", 243, null, "r"], ["Cm", "curium", 247, null, "r"],
  ["Bk", "berkelium", 247, null, "r"], ["Cf", "californium", 251, null, "r"], ["Es", "einsteinium", 252, null, "r"],
  ["Fm", "fermium", 257, null, "r"], ["Md", "mendelevium", 258, null, "r"], ["No", "nobelium", 259, null, "r"],
  ["Lr", "lawrencium", 262, null, "r"], ["Rf", "rutherfordium", 267, null, "r"], ["Db", "dubnium", 268, null, "r"],
  ["Sg", "seaborgium", 269, null, "r"], ["Bh", "bohrium", 270, null, "r"], ["Hs", "hassium", 269, null, "r"],
  ["Mt", "meitnerium", 278, null, "r"], ["Ds", "darmstadtium", 281, null, "r"], ["Rg", "roentgenium", 282, null, "r"],
  ["Cn", "copernicium", 285, null, "r"], ["Nh", "nihonium", 286, null, "r"], ["Fl", "flerovium", 290, null, "r"],
  ["Mc", "moscovium", 290, null, "r"], ["Lv", "livermorium", 293, null, "r"], ["Ts", "tennessine", 294, null, "r"],
  ["Og", "oganesson", 294, null, "r"],
];

const KIND = { i: "interval", r: "no-stable" } as const;

/** All 118 elements in order of atomic number. */
export const ELEMENTS: readonly Element[] = Object.freeze(
  ROWS.map(([symbol, name, atomicWeight, uncertainty, k], i) =>
    Object.freeze({ z: i + 1, symbol, name, atomicWeight, uncertainty, kind: k ? KIND[k] : "standard" } as Element)),
);

const BY_SYMBOL = new Map(ELEMENTS.map((e) => [e.symbol, e]));

/** The element with this symbol (case-sensitive: "Co" cobalt, not "CO"), or undefined. */
export function elementBySymbol(symbol: string): Element | undefined {
  return BY_SYMBOL.get(symbol);
}

/** Citation of the atomic-weight table, for provenance records and the UI. */
export const ATOMIC_WEIGHT_SOURCE =
  "IUPAC/CIAAW Standard atomic weights of the elements 2021, abridged values (Prohaska et al., Pure Appl. Chem. 94, 573 (2022)); typed from memory";
