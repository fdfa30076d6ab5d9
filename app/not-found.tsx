import Link from "next/link";

/** 404: also what a non-member sees for another group's pages (groups do not leak across). */
export default function NotFound() {
  return (
    <div className="narrow">
      <h1>Not found</h1>
      <p className="lede">There is nothing here, or it belongs to a group you are not a member of.</p>
      <p><Link href="/groups">Go to my groups</Link></p>
    </div>
  );
}
