/**
 * The route table. Pages load lazily; each feature adds its entries here (one object per route).
 */
import { createBrowserRouter, type RouteObject } from "react-router-dom";
import { AppLayout } from "./layouts/app-layout";
import { RouteError } from "./routes/route-error";
import { HomePage } from "./routes/home";
import { NotFoundPage } from "./routes/not-found";
import { paths } from "../config/paths";
import { queryClient } from "../lib/query-client";
import { getSessionQueryOptions } from "../features/auth/api/get-session";

const routes: RouteObject[] = [
  {
    element: <AppLayout />,
    errorElement: <RouteError />,
    loader: () => queryClient.ensureQueryData(getSessionQueryOptions()),
    children: [
      { path: paths.home.path, element: <HomePage /> },
      // --- feature routes (keep one entry per line group, sorted by feature) ---
      { path: paths.catalogue.path, lazy: () => import("./routes/catalogue") },
      { path: paths.apiDocs.path, lazy: () => import("./routes/api-docs") },
      // deposit and curation
      { path: paths.deposit.path, lazy: () => import("./routes/deposits/deposit") },
      { path: paths.depositResume.path, lazy: () => import("./routes/deposits/deposit") },
      { path: paths.myDeposits.path, lazy: () => import("./routes/deposits/my-deposits") },
      { path: paths.reviewQueue.path, lazy: () => import("./routes/reviews/queue") },
      { path: paths.review.path, lazy: () => import("./routes/reviews/review") },
      { path: paths.pipeline.path, lazy: () => import("./routes/admin/pipeline") },
      // accounts
      { path: paths.signIn.path, lazy: () => import("./routes/accounts/sign-in") },
      { path: paths.signUp.path, lazy: () => import("./routes/accounts/sign-up") },
      { path: paths.orcidSignUp.path, lazy: () => import("./routes/accounts/orcid-sign-up") },
      { path: paths.verifyEmail.path, lazy: () => import("./routes/accounts/verify-email") },
      { path: paths.forgotPassword.path, lazy: () => import("./routes/accounts/forgot-password") },
      { path: paths.resetPassword.path, lazy: () => import("./routes/accounts/reset-password") },
      { path: paths.account.path, lazy: () => import("./routes/accounts/account") },
      { path: paths.users.path, lazy: () => import("./routes/admin/users") },
      { path: paths.outbox.path, lazy: () => import("./routes/admin/outbox") },
      { path: paths.outboxMessage.path, lazy: () => import("./routes/admin/outbox-message") },
      // dataset pages, network views, compare, coverage map
      { path: paths.dataset.path, lazy: () => import("./routes/datasets/dataset") },
      { path: paths.datasetVersion.path, lazy: () => import("./routes/datasets/dataset") },
      { path: paths.networkView.path, lazy: () => import("./routes/datasets/network-view") },
      { path: paths.compare.path, lazy: () => import("./routes/compare") },
      { path: paths.coverageMap.path, lazy: () => import("./routes/coverage-map") },
      // collections
      { path: paths.collections.path, lazy: () => import("./routes/collections/my-collections") },
      { path: paths.collection.path, lazy: () => import("./routes/collections/collection") },
      { path: "*", element: <NotFoundPage /> },
    ],
  },
];

export const router = createBrowserRouter(routes);
