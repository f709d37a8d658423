// The placeholder a loading.tsx shows while its page is read on the server.
export function PageSkeleton() {
  return (
    <div className="animate-pulse space-y-4" aria-busy="true" aria-label="Loading">
      <div className="h-7 w-64 rounded bg-line" />
      <div className="h-32 rounded-lg bg-line/60" />
    </div>
  );
}
