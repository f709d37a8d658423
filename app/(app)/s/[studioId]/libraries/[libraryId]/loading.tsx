// Shown while the page below loads. Only in segments whose layout above has already checked the studio (and
// the library): a loading boundary higher up would start the answer before a notFound() could make it a 404
// (Next.js streams a notFound() inside a Suspense boundary as a 200 with a "noindex" tag).
export default function Loading() {
  return (
    <div className="animate-pulse space-y-4" aria-busy="true" aria-label="Loading">
      <div className="h-7 w-64 rounded bg-line" />
      <div className="h-32 rounded-lg bg-line/60" />
    </div>
  );
}
