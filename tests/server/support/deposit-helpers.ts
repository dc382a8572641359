/**
 * Helpers for deposit and review tests: valid metadata (invented, demo-style), small network files, and
 * calls through the API with a signed-in agent.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import type { SignedInAgent } from "./accounts";

export const FIXTURES = join(process.cwd(), "tests", "fixtures");
export const davisCsv = () => readFileSync(join(FIXTURES, "davis-southern-women.csv"));
export const karateCsv = () => readFileSync(join(FIXTURES, "karate.edgelist.csv"));

export function studyMeta(over: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    title: "Flower visitors of the Verrin Hills heath",
    description: "Plant–pollinator interactions recorded by timed watches (invented demo data).",
    creators: [{ name: "Hale, Rowan", orcid: "0000-0002-1825-0097", affiliation: "Verrin Hills Ecology Group" }],
    licence: "CC-BY-4.0",
    keywords: ["pollination", "heath"],
    contactEmail: "rowan.hale@example.test",
    ...over,
  };
}

export function networkMeta(over: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    name: "Crook Heath 2019",
    interactionType: "pollination",
    weightMeaning: "binary",
    rowLevel: "plants",
    colLevel: "pollinators",
    locality: { placeName: "Crook Heath", countryCode: "GB", decimalLatitude: 54.43127, decimalLongitude: -2.98714, generalisation: "0.1" },
    habitat: "upland heath",
    startDate: "2019-05-01",
    endDate: "2019-08-31",
    samplingProtocol: "Timed watches of flowering plants.",
    ...over,
  };
}

export const SMALL_MATRIX = "plant,bee A,bee B,fly C\nHeather,1,0,2\nGorse,0,1,1\nBilberry,3,0,0\n";

/** Creates a draft with metadata and uploads files (name → content). Returns the version id. */
export async function makeDraft(a: SignedInAgent, files: Array<[string, Buffer | string]> = [["heath.csv", SMALL_MATRIX]], opts: { kind?: string; directed?: boolean } = {}): Promise<{ versionId: number; networkIds: number[] }> {
  const c = await a.agent.post("/api/v1/deposits").set("x-csrf-token", a.csrf).send({ metadata: studyMeta() });
  if (c.status !== 201) throw new Error(`create: ${c.status} ${JSON.stringify(c.body)}`);
  const versionId = c.body.versionId as number;
  let req = a.agent.post(`/api/v1/deposits/${versionId}/networks`).set("x-csrf-token", a.csrf).field("kind", opts.kind ?? "bipartite");
  if (opts.directed !== undefined) req = req.field("directed", String(opts.directed));
  for (const [name, content] of files) req = req.attach("files", Buffer.from(content), name);
  const u = await req;
  if (u.status !== 201) throw new Error(`upload: ${u.status} ${JSON.stringify(u.body)}`);
  const networkIds = (u.body.networks as Array<{ id: number }>).map((n) => n.id);
  for (const id of networkIds) {
    const p = await a.agent.patch(`/api/v1/deposits/${versionId}/networks/${id}`).set("x-csrf-token", a.csrf).send({ metadata: networkMeta(opts.kind === "unipartite" ? { rowLevel: undefined, colLevel: undefined, interactionType: "predator-prey", directionMeaning: opts.directed ? "row eats column" : undefined } : {}) });
    if (p.status !== 200) throw new Error(`network metadata: ${p.status} ${JSON.stringify(p.body)}`);
  }
  return { versionId, networkIds };
}

export async function submit(a: SignedInAgent, versionId: number) {
  return a.agent.post(`/api/v1/deposits/${versionId}/submit`).set("x-csrf-token", a.csrf).send({});
}

export async function decide(a: SignedInAgent, versionId: number, body: Record<string, unknown>) {
  return a.agent.post(`/api/v1/reviews/${versionId}/decision`).set("x-csrf-token", a.csrf).send(body);
}
