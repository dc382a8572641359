/** The signed-in person's own profile and password (browser sessions only: API tokens cannot change them). */
import { Router, type RequestHandler } from "express";
import { requireSignedIn } from "../../middlewares/require-role";
import { ApiError } from "../../lib/api-error";
import * as c from "./account.controller";

const sessionOnly: RequestHandler = (req, _res, next) => {
  if (req.authVia === "token") throw ApiError.forbidden("Profile and password can only be changed when signed in through the website.");
  next();
};

export const accountRouter = Router();

accountRouter.get("/", requireSignedIn, c.show);
accountRouter.patch("/", requireSignedIn, sessionOnly, c.update);
accountRouter.put("/password", requireSignedIn, sessionOnly, c.changePassword);
accountRouter.delete("/orcid", requireSignedIn, sessionOnly, c.unlinkOrcid);
