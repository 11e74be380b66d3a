import { certifyDecimation, certifyLumping, type Certificate } from "@/lib/certificate";
import { canonicalModel, describeModel, modelAddress } from "@/lib/models";
import { submitCertificate, type SubmitResult } from "@/server/atlas/submit";
import { getModel, updateModelDetails } from "../queries/models";

/**
 * Invented Markov chains of the demo (made-up numbers, no source): each one is built with a
 * symmetry or a shared exit rate so that it has strong lumpings, which the seed submits as
 * certificates together with a few decimations.
 */
export const DEMO_CHAINS = {
  /**
   * Kestrel Lab's two identical sample bays, watched once an hour: empty, only the left bay busy,
   * only the right bay busy, both busy. The two bays are interchangeable, so "one bay busy" lumps.
   */
  twinBayQueue: {
    kind: "markov",
    labels: ["empty", "left busy", "right busy", "both busy"],
    matrix: [
      ["1/2", "1/4", "1/4", "0"],
      ["1/3", "1/3", "0", "1/3"],
      ["1/3", "0", "1/3", "1/3"],
      ["0", "1/4", "1/4", "1/2"],
    ],
  },
  /**
   * A made-up ward model with compartments susceptible, exposed, infectious, recovered, read once a
   * day. Exposed and infectious patients recover at the same rate (1/4) and never return to
   * susceptible, so "carrying the infection" lumps.
   */
  wardCompartments: {
    kind: "markov",
    labels: ["susceptible", "exposed", "infectious", "recovered"],
    matrix: [
      ["7/10", "1/5", "1/10", "0"],
      ["0", "1/2", "1/4", "1/4"],
      ["0", "0", "3/4", "1/4"],
      ["1/10", "0", "0", "9/10"],
    ],
  },
  /**
   * An invented three-shelf greenhouse humidity sensor (dry, damp, wet) with a sticky middle state;
   * no proper lumping, but its decimations are in the atlas.
   */
  greenhouseSensor: {
    kind: "markov",
    labels: ["dry", "damp", "wet"],
    matrix: [
      ["3/5", "2/5", "0"],
      ["1/6", "2/3", "1/6"],
      ["0", "1/2", "1/2"],
    ],
  },
} as const;

function holds(result: { ok: true; certificate: Certificate } | { ok: false }, what: string): Certificate {
  if (!result.ok) throw new Error(`demo data: ${what} does not hold`);
  return result.certificate;
}

/** The demo's lumpings and decimations, as certificates (built, then verified again on submission). */
export function demoChainCertificates(): { what: string; certificate: Certificate }[] {
  const { twinBayQueue, wardCompartments, greenhouseSensor } = DEMO_CHAINS;
  const oneBay = holds(certifyLumping({ chain: twinBayQueue, partition: [0, 1, 1, 2] }), "twin-bay lumping");
  const parity = holds(certifyLumping({ chain: oneBay.target, partition: [0, 1, 0] }), "busy-bay parity lumping");
  const carrying = holds(certifyLumping({ chain: wardCompartments, partition: [0, 1, 1, 2] }), "ward lumping");
  return [
    { what: "twin-bay queue: one bay busy, either side", certificate: oneBay },
    { what: "twin-bay queue: an odd number of busy bays", certificate: parity },
    { what: "twin-bay queue: every two hours", certificate: holds(certifyDecimation({ chain: twinBayQueue, steps: 2 }), "twin-bay decimation") },
    { what: "ward: carrying the infection", certificate: carrying },
    { what: "ward: weekly", certificate: holds(certifyDecimation({ chain: wardCompartments, steps: 7 }), "ward decimation") },
    { what: "ward, lumped: weekly", certificate: holds(certifyDecimation({ chain: carrying.target, steps: 7 }), "lumped ward decimation") },
    {
      what: "ward: carrying the infection, weekly",
      certificate: holds(certifyLumping({ chain: wardCompartments, partition: [0, 1, 1, 2], steps: 7 }), "weekly ward lumping"),
    },
    { what: "greenhouse sensor: every two readings", certificate: holds(certifyDecimation({ chain: greenhouseSensor, steps: 2 }), "sensor decimation") },
  ];
}

type Named = { name: string; description: string };

/**
 * The scenario names of the demo's chains, by the certificate that produces them: each source and
 * target gets a name a reader recognises instead of "Markov chain (4 states)".
 */
const SCENARIO_NAMES: Record<string, { source?: Named; target?: Named }> = {
  "twin-bay queue: one bay busy, either side": {
    source: { name: "Twin-bay queue", description: "Two identical sample bays watched once an hour: empty, left busy, right busy, both busy." },
    target: { name: "Twin-bay queue: busy bays counted", description: "The twin-bay queue with the two bays interchangeable: no bay, one bay or both bays busy." },
  },
  "twin-bay queue: an odd number of busy bays": {
    target: { name: "Twin-bay queue: parity of busy bays", description: "Whether an even or an odd number of bays is busy." },
  },
  "twin-bay queue: every two hours": {
    target: { name: "Twin-bay queue, every two hours", description: "The twin-bay queue read every second hour (two steps in one)." },
  },
  "ward: carrying the infection": {
    source: { name: "Ward compartments", description: "A made-up ward read once a day: susceptible, exposed, infectious, recovered." },
    target: { name: "Ward compartments: carrying the infection", description: "The ward with exposed and infectious patients in one block, since both recover at 1/4 a day." },
  },
  "ward: weekly": {
    target: { name: "Ward compartments, weekly", description: "The ward read once a week (seven daily steps in one)." },
  },
  "ward, lumped: weekly": {
    target: { name: "Ward compartments: carrying the infection, weekly", description: "The lumped ward read once a week." },
  },
  "greenhouse sensor: every two readings": {
    source: { name: "Greenhouse sensor", description: "An invented three-shelf humidity sensor: dry, damp, wet, with a sticky middle state." },
    target: { name: "Greenhouse sensor, every two readings", description: "The greenhouse sensor read every second time." },
  },
};

/** Names a model of the scenario unless someone has renamed it already (the seed never overwrites a person's name). */
async function nameModel(workspaceId: string, model: Certificate["source"], named: Named): Promise<void> {
  const canonical = canonicalModel(model);
  const row = await getModel({ workspaceId, idOrAddress: modelAddress(canonical) });
  if (row && row.name === describeModel(canonical)) {
    await updateModelDetails({ workspaceId, modelId: row.id, userId: null, ...named });
  }
}

/** Submits the demo chains' certificates through the atlas's verified path; running it again changes nothing. */
export async function seedDemoChains({ workspaceId, userId }: { workspaceId: string; userId: string }): Promise<(SubmitResult & { what: string })[]> {
  const results = [];
  for (const { what, certificate } of demoChainCertificates()) {
    results.push({ what, ...(await submitCertificate({ workspaceId, userId, certificate })) });
    const names = SCENARIO_NAMES[what];
    if (names?.source) await nameModel(workspaceId, certificate.source, names.source);
    if (names?.target) await nameModel(workspaceId, certificate.target, names.target);
  }
  return results;
}
