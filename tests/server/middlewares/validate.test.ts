/**
 * validate(schema): the declarative checks the routes mount. Answers in the one error shape with every
 * field named (query and path by name, body by JSON pointer), coerced values reach the handler, an empty
 * query value counts as absent, and a path parameter that cannot be an id answers 404.
 */
import express from "express";
import request from "supertest";
import { describe, expect, it } from "vitest";
import { validate } from "../../../server/src/middlewares/validate";
import { errorHandler } from "../../../server/src/middlewares/error-handler";
import { userListSchema } from "../../../server/src/api/users/users.schemas";
import { createTokenSchema, revokeTokenSchema } from "../../../server/src/api/tokens/tokens.schemas";

const app = express();
app.use(express.json());
app.get("/users", validate(userListSchema), (req, res) => void res.json({ query: req.query }));
app.post("/tokens", validate(createTokenSchema), (req, res) => void res.json({ body: req.body }));
app.delete("/tokens/:id", validate(revokeTokenSchema), (req, res) => void res.json({ params: req.params }));
app.use(errorHandler);

describe("validate(schema)", () => {
  it("coerces the query to the schema's types, fills defaults and reads an empty value as absent", async () => {
    const res = await request(app).get("/users").query({ page: "3", role: "", email: "heath" });
    expect(res.status).toBe(200);
    expect(res.body.query).toEqual({ page: 3, pageSize: 25, email: "heath" });
  });

  it("names every refused query parameter with its rule", async () => {
    const res = await request(app).get("/users").query({ page: "1.5", pageSize: "1000", role: "overlord" });
    expect(res.status).toBe(400);
    expect(res.body.code).toBe("bad_request");
    expect(res.body.details).toEqual([
      { path: "role", message: "role must be one of depositor, curator, admin." },
      { path: "page", message: "page must be a whole number from 1 to 100000." },
      { path: "pageSize", message: "pageSize must be a whole number from 1 to 100." },
    ]);
    const one = await request(app).get("/users").query({ page: "0" });
    expect(one.body.message).toBe("page must be a whole number from 1 to 100000.");
  });

  it("refuses a body field by its JSON pointer, with the route's status", async () => {
    const missing = await request(app).post("/tokens").send({});
    expect(missing.status).toBe(422);
    expect(missing.body).toEqual({ code: "validation_failed", message: "name is required: it must be text of 1 to 80 characters, not only spaces.", details: [{ path: "/name", message: "name is required: it must be text of 1 to 80 characters, not only spaces." }] });
    const blank = await request(app).post("/tokens").send({ name: "   " });
    expect(blank.status).toBe(422);
    expect(blank.body.details).toEqual([{ path: "/name", message: "name must be text of 1 to 80 characters, not only spaces." }]);
    const long = await request(app).post("/tokens").send({ name: "x".repeat(81) });
    expect(long.body.details[0].path).toBe("/name");
    const ok = await request(app).post("/tokens").send({ name: "R scripts" });
    expect(ok.status).toBe(200);
    const list = await request(app).post("/tokens").set("content-type", "application/json").send("[1]");
    expect(list.status).toBe(400);
    expect(list.body.message).toBe("The request body must be a JSON object.");
  });

  it("answers 404 naming the thing for a path parameter that cannot be an id, and coerces a good one", async () => {
    for (const bad of ["abc", "0", "1.5", "9999999999"]) {
      const res = await request(app).delete(`/tokens/${bad}`);
      expect(res.status, bad).toBe(404);
      expect(res.body).toEqual({ code: "not_found", message: "No such token." });
    }
    const res = await request(app).delete("/tokens/12");
    expect(res.body.params).toEqual({ id: 12 });
  });
});
