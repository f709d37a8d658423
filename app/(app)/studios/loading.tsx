// Shown while the studio list loads. Loading boundaries sit only where nothing below answers "not found": one
// above the studio pages would start the answer before their notFound() could make it a 404 (Next.js streams a
// notFound() inside a Suspense boundary as a 200 with a "noindex" tag).
export default function Loading() {
  return (
    <div className="animate-pulse space-y-4" aria-busy="true" aria-label="Loading">
      <div className="h-7 w-64 rounded bg-line" />
      <div className="h-32 rounded-lg bg-line/60" />
    </div>
  );
}
