/** Packed point sources of step outputs: packing keeps every point's measurement and index, in order. */
import { describe, it, expect } from "vitest";
import { packSources, sourceAt } from "../../lib/engine/notebook";

const A = "0b6f1f7e-3a4c-4d5e-8f90-112233445566";
const B = "9c1d2e3f-4a5b-4c6d-8e7f-665544332211";

describe("point sources", () => {
  it("packSources lists each measurement id once and keeps every point's index in order", () => {
    const list = [{ measurementId: A, index: 4 }, { measurementId: B, index: 0 }, { measurementId: A, index: 5 }, { measurementId: B, index: 9 }];
    const p = packSources(list);
    expect(p.measurementIds).toEqual([A, B]);
    expect(p.measurement).toEqual([0, 1, 0, 1]);
    expect(p.index).toEqual([4, 0, 5, 9]);
    expect(list.map((_, i) => sourceAt(p, i))).toEqual(list);
  });

  it("sourceAt gives null past the end, for no sources, and reads the older list form", () => {
    const p = packSources([{ measurementId: A, index: 2 }]);
    expect(sourceAt(p, 1)).toBeNull();
    expect(sourceAt(null, 0)).toBeNull();
    expect(sourceAt([{ measurementId: B, index: 7 }], 0)).toEqual({ measurementId: B, index: 7 });
    expect(sourceAt(packSources([]), 0)).toBeNull();
  });
});
