import { redirect } from "next/navigation";

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

/** The old chain editor's address: chains are now built on the workbench, which opens with the same `?maps=`. */
export default async function NewChainPage({ searchParams }: Props) {
  const maps = (await searchParams).maps;
  const list = Array.isArray(maps) ? maps[0] : maps;
  redirect(list ? `/chains/workbench?maps=${encodeURIComponent(list)}` : "/chains/workbench");
}
