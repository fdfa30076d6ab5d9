/**
 * A symbol typeset as the trade writes it: markup "Θ_D", "χ²_red", "r_s/a_0" from the display
 * vocabulary (lib/display) with real <sub>/<sup>. Never use it on people's text.
 */
import { Fragment } from "react";
import { runs } from "@/lib/display/typeset";

export function Sym({ m }: { m: string }) {
  return (
    <>
      {runs(m).map((r, i) => (r.shift === "sub" ? <sub key={i}>{r.text}</sub> : r.shift === "sup" ? <sup key={i}>{r.text}</sup> : <Fragment key={i}>{r.text}</Fragment>))}
    </>
  );
}
