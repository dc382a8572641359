/**
 * What DataCite requires of a DOI's metadata, as a JSON Schema over the attributes of DataCite's REST API
 * (JSON:API, `data.attributes`). Transcribed from the DataCite Metadata Schema 4.6 (mandatory properties:
 * 1 Identifier, 2 Creator with creatorName, 3 Title, 4 Publisher, 5 PublicationYear, 10 ResourceType with
 * resourceTypeGeneral from its controlled list), plus the REST API's own rule that a DOI made findable or
 * registered needs a URL, and the controlled lists of the optional properties Tanglebank sends
 * (nameIdentifierScheme, relatedIdentifierType, relationType, descriptionType, dateType).
 *
 * The local DataCite stand-in validates every payload with it and answers DataCite-shaped errors; the
 * tests check Tanglebank's payloads against it.
 */
export const DATACITE_SCHEMA_VERSION = "4.6";
export const DATACITE_SCHEMA_URI = "http://datacite.org/schema/kernel-4";

/** resourceTypeGeneral, DataCite Metadata Schema 4.6 appendix (controlled list). */
export const RESOURCE_TYPE_GENERAL = [
  "Audiovisual", "Award", "Book", "BookChapter", "Collection", "ComputationalNotebook", "ConferencePaper", "ConferenceProceeding",
  "DataPaper", "Dataset", "Dissertation", "Event", "Image", "Instrument", "InteractiveResource", "Journal", "JournalArticle", "Model",
  "OutputManagementPlan", "PeerReview", "PhysicalObject", "Preprint", "Project", "Report", "Service", "Software", "Sound", "Standard",
  "StudyRegistration", "Text", "Workflow", "Other",
] as const;

/** relationType, DataCite Metadata Schema 4.6 (controlled list). */
export const RELATION_TYPES = [
  "IsCitedBy", "Cites", "IsSupplementTo", "IsSupplementedBy", "IsContinuedBy", "Continues", "IsDescribedBy", "Describes", "HasMetadata",
  "IsMetadataFor", "HasVersion", "IsVersionOf", "IsNewVersionOf", "IsPreviousVersionOf", "IsPartOf", "HasPart", "IsPublishedIn",
  "IsReferencedBy", "References", "IsDocumentedBy", "Documents", "IsCompiledBy", "Compiles", "IsVariantFormOf", "IsOriginalFormOf",
  "IsIdenticalTo", "IsReviewedBy", "Reviews", "IsDerivedFrom", "IsSourceOf", "IsRequiredBy", "Requires", "IsObsoletedBy", "Obsoletes",
  "IsCollectedBy", "Collects", "IsTranslationOf", "HasTranslation",
] as const;

/** relatedIdentifierType, DataCite Metadata Schema 4.6 (controlled list). */
export const RELATED_IDENTIFIER_TYPES = [
  "ARK", "arXiv", "bibcode", "CSTR", "DOI", "EAN13", "EISSN", "Handle", "IGSN", "ISBN", "ISSN", "ISTC", "LISSN", "LSID", "PMID", "PURL",
  "RRID", "UPC", "URL", "URN", "w3id",
] as const;

const nonBlank = { type: "string", minLength: 1, pattern: "\\S" } as const;

export const dataciteAttributesSchema = {
  $id: "https://tanglebank.test/schemas/datacite-attributes-4.6.json",
  type: "object",
  required: ["creators", "titles", "publisher", "publicationYear", "types"],
  properties: {
    doi: { type: "string", pattern: "^10\\.\\d{4,9}/\\S+$" },
    prefix: { type: "string", pattern: "^10\\.\\d{4,9}$" },
    event: { enum: ["publish", "register", "hide"] },
    url: { type: "string", pattern: "^https?://" },
    schemaVersion: { const: DATACITE_SCHEMA_URI },
    creators: {
      type: "array",
      minItems: 1,
      items: {
        type: "object",
        required: ["name"],
        properties: {
          name: nonBlank,
          nameType: { enum: ["Personal", "Organizational"] },
          givenName: { type: "string" },
          familyName: { type: "string" },
          nameIdentifiers: {
            type: "array",
            items: {
              type: "object",
              required: ["nameIdentifier", "nameIdentifierScheme"],
              properties: { nameIdentifier: nonBlank, nameIdentifierScheme: nonBlank, schemeUri: { type: "string" } },
            },
          },
          affiliation: { type: "array", items: { type: "object", required: ["name"], properties: { name: nonBlank } } },
        },
      },
    },
    titles: { type: "array", minItems: 1, items: { type: "object", required: ["title"], properties: { title: nonBlank } } },
    // a string before schema 4.5, an object with a name since
    publisher: { anyOf: [nonBlank, { type: "object", required: ["name"], properties: { name: nonBlank } }] },
    publicationYear: { anyOf: [{ type: "integer", minimum: 1000, maximum: 9999 }, { type: "string", pattern: "^\\d{4}$" }] },
    types: { type: "object", required: ["resourceTypeGeneral"], properties: { resourceTypeGeneral: { enum: RESOURCE_TYPE_GENERAL }, resourceType: { type: "string" } } },
    subjects: { type: "array", items: { type: "object", required: ["subject"], properties: { subject: nonBlank } } },
    rightsList: { type: "array", items: { type: "object", anyOf: [{ required: ["rights"] }, { required: ["rightsIdentifier"] }] } },
    descriptions: {
      type: "array",
      items: {
        type: "object",
        required: ["description", "descriptionType"],
        properties: { description: nonBlank, descriptionType: { enum: ["Abstract", "Methods", "SeriesInformation", "TableOfContents", "TechnicalInfo", "Other"] } },
      },
    },
    dates: {
      type: "array",
      items: {
        type: "object",
        required: ["date", "dateType"],
        properties: {
          date: nonBlank,
          dateType: { enum: ["Accepted", "Available", "Copyrighted", "Collected", "Coverage", "Created", "Issued", "Submitted", "Updated", "Valid", "Withdrawn", "Other"] },
        },
      },
    },
    relatedIdentifiers: {
      type: "array",
      items: {
        type: "object",
        required: ["relatedIdentifier", "relatedIdentifierType", "relationType"],
        properties: { relatedIdentifier: nonBlank, relatedIdentifierType: { enum: RELATED_IDENTIFIER_TYPES }, relationType: { enum: RELATION_TYPES } },
      },
    },
    version: { type: "string" },
  },
} as const;
