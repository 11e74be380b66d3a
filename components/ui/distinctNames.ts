/** A model as a picker lists it. */
export type NamedModel = { id: string; name: string; kind?: string; address?: string };

/**
 * The label of each model in a picker: its name, and where several models share that name, what tells
 * them apart (kind and the start of the content address, or of the id), so a person never picks blind.
 */
export function distinctNames<T extends NamedModel>(models: T[]): (T & { label: string })[] {
  const count = new Map<string, number>();
  for (const m of models) count.set(m.name.toLowerCase(), (count.get(m.name.toLowerCase()) ?? 0) + 1);
  return models.map((m) => {
    if ((count.get(m.name.toLowerCase()) ?? 0) < 2) return { ...m, label: m.name };
    const tag = m.address ? m.address.replace(/^sha256:/, "").slice(0, 8) : m.id.slice(0, 8);
    return { ...m, label: `${m.name} (${[m.kind, tag].filter(Boolean).join(", ")})` };
  });
}
