import Link from "next/link";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/server/session";
import { database as getDb } from "@/lib/server/database";
import { listMyGroups } from "@/lib/server/groups";
import { groupPaths } from "@/app/_lib/paths";

export const dynamic = "force-dynamic";

/** Signed out: what Heatbook is for. Signed in: straight to the first group (or the group list). */
export default async function Landing() {
  const user = await currentUser();
  if (user) {
    const groups = await listMyGroups(getDb(), user.id);
    redirect(groups[0] ? groupPaths(groups[0].slug).home : "/groups");
  }
  return (
    <section className="landing">
      <h1>Specific heat of metals, from raw curve to reviewed number.</h1>
      <p className="lede">
        Heatbook lets a calorimetry group bring in C(T) curves measured between a fraction of a kelvin and a few tens of kelvin,
        fit the Sommerfeld coefficient γ (mJ mol⁻¹ K⁻²) and the lattice term β with the Debye temperature Θ<sub>D</sub> (K), and have the results reviewed and
        locked so every published value traces back to its data.
      </p>
      <div className="actions">
        <Link className="button" href="/signin">Sign in</Link>
        <Link className="button quiet" href="/signup">Create an account</Link>
      </div>
    </section>
  );
}
