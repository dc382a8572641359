/** The API documentation page, rendered from /api/v1/openapi.json. */
import { ApiDocsPage } from "../../features/api-docs/components/api-docs-page";

export function Component() {
  return <ApiDocsPage />;
}
