/** The signed-in person's own profile and password (browser sessions only: API tokens cannot change them). */
import { Router } from "express";
import { requireBrowserSession, requireSignedIn } from "../../middlewares/require-role";
import * as c from "./account.controller";

export const accountRouter = Router();

accountRouter.get("/", requireSignedIn, c.show);
accountRouter.patch("/", requireBrowserSession, c.update);
accountRouter.put("/password", requireBrowserSession, c.changePassword);
accountRouter.delete("/orcid", requireBrowserSession, c.unlinkOrcid);
