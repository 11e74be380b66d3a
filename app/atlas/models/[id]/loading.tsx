import { PageSkeleton } from "@/components/atlas/page-skeleton";

export default function Loading() {
  return <PageSkeleton label="Loading the model" panels={3} />;
}
