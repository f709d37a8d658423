// Shown while the page below loads. Only in segments whose layout above has already checked the studio (and
// the library): a loading boundary higher up would start the answer before a notFound() could make it a 404
// (Next.js streams a notFound() inside a Suspense boundary as a 200 with a "noindex" tag).
import { PageSkeleton } from "@/components/page-skeleton";

export default function Loading() {
  return <PageSkeleton />;
}
