export default function Loading() {
  return (
    <p aria-live="polite" className="muted">
      Loading…
    </p>
  );
}
