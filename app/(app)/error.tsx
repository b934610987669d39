"use client";

export default function AreaError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="notice danger">
      <h1>Something went wrong</h1>
      <p>The page could not be shown. Nothing you had saved is lost.{error.digest ? ` (reference ${error.digest})` : ""}</p>
      <button type="button" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
