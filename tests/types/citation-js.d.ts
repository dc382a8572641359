/** Minimal typings for the parts of citation-js the citation tests use (the packages ship no types). */
declare module "@citation-js/core" {
  export class Cite {
    constructor(data: unknown);
    data: unknown[];
  }
}
declare module "@citation-js/plugin-ris";
