import { describe, expect, it } from "vitest";
import { GET } from "@/app/api/openapi.json/route";

describe("GET /api/openapi.json", () => {
  it("is an OpenAPI 3.1 document with every atlas route, its parameters and the shared error shape", async () => {
    const res = await GET(new Request("http://local/api/openapi.json"), { params: Promise.resolve({}) });
    expect(res.status).toBe(200);
    const doc = (await res.json()) as {
      openapi: string;
      paths: Record<string, Record<string, { parameters?: { name: string }[]; responses: Record<string, unknown> }>>;
      components: { schemas: Record<string, unknown>; securitySchemes: Record<string, unknown> };
    };
    expect(doc.openapi).toBe("3.1.0");
    for (const path of ["/api/models", "/api/models/{id}/maps", "/api/certificates", "/api/maps/{id}/retract", "/api/chains", "/api/paths", "/api/ask", "/api/search", "/api/tokens", "/api/tokens/{id}"]) {
      expect(doc.paths, path).toHaveProperty([path]);
    }
    const fromTo = doc.paths["/api/models/{id}/maps"].get;
    expect(fromTo.parameters!.map((p) => p.name)).toEqual(expect.arrayContaining(["id", "direction", "kind", "block", "cursor"]));
    expect(Object.keys(doc.paths["/api/certificates"].post.responses)).toEqual(expect.arrayContaining(["200", "201", "400", "401", "403", "413", "422"]));
    expect(doc.components.schemas).toHaveProperty("Error");
    expect(doc.components.securitySchemes).toHaveProperty("bearer");
  });
});
