/** The signed-in person's own profile and password (browser sessions only: API tokens cannot change them). */
import { Router } from "express";
import { requireBrowserSession, requireSignedIn } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import * as c from "./account.controller";
import { passwordChangeSchema, profileSchema } from "./account.schemas";

export const accountRouter = Router();

accountRouter.get("/", requireSignedIn, c.show);
accountRouter.patch("/", requireBrowserSession, validate(profileSchema), c.update);
accountRouter.put("/password", requireBrowserSession, validate(passwordChangeSchema), c.changePassword);
accountRouter.delete("/orcid", requireBrowserSession, c.unlinkOrcid);
