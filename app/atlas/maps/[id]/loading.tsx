import { PageSkeleton } from "@/components/atlas/page-skeleton";

export default function Loading() {
  return <PageSkeleton label="Loading the map and its certificate" panels={3} />;
}
