"use client";

/** Unexpected failures: say so plainly and offer a retry; details stay in the server log. */
export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="narrow">
      <h1>Something went wrong</h1>
      <p className="lede">The page could not be shown. {error.digest ? `Reference ${error.digest} in the server log.` : ""}</p>
      <button type="button" onClick={reset}>Try again</button>
    </div>
  );
}
