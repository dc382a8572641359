/** Request schemas of /api/v1/users (admin): mounted by the routes through validate(). */
import type { RequestSchema } from "../../middlewares/validate";
import { ROLES } from "../../models/user.model";
import { idField } from "../common.schemas";

export const userListSchema: RequestSchema = {
  query: {
    type: "object",
    properties: {
      role: { type: "string", enum: [...ROLES], description: "Only accounts with this role" },
      email: { type: "string", description: "Part of the e-mail address (the first 254 characters are used)" },
      page: { type: "integer", minimum: 1, maximum: 100000, default: 1, description: "Page number, from 1" },
      pageSize: { type: "integer", minimum: 1, maximum: 100, default: 25, description: "Accounts per page" },
    },
  },
};

export const roleChangeSchema: RequestSchema = {
  params: { type: "object", properties: { id: idField("user", "The account's id") }, required: ["id"] },
  body: { type: "object", properties: { role: { type: "string", enum: [...ROLES], description: "The new role" } }, required: ["role"] },
  bodyStatus: 422,
};
