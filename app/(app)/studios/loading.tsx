// Shown while the studio list loads. Loading boundaries sit only where nothing below answers "not found": one
// above the studio pages would start the answer before their notFound() could make it a 404 (Next.js streams a
// notFound() inside a Suspense boundary as a 200 with a "noindex" tag).
import { PageSkeleton } from "@/components/page-skeleton";

export default function Loading() {
  return <PageSkeleton />;
}
