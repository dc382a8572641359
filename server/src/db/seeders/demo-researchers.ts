/**
 * The researchers the local ORCID stand-in knows: the invented people of the Northmoor Field Station
 * scenario (demo only), with made-up ORCID iDs that pass ORCID's check digit (ISO 7064 MOD 11-2) but lie
 * in a block ORCID does not issue (0000-0004-…), so they can never be a real person's iD. Five of them
 * have demo accounts (README's demo sign-ins); Lior Vantelle has none, to show a new account made from an
 * ORCID record.
 */
export interface DemoResearcher {
  orcid: string;
  givenName: string;
  familyName: string;
  /** The demo account's e-mail, when the person has one (ORCID rarely shares e-mail addresses). */
  email?: string;
  affiliation: string;
}

export const DEMO_RESEARCHERS: DemoResearcher[] = [
  { orcid: "0000-0004-2718-3011", givenName: "Rowan", familyName: "Hale", email: "rowan.hale@northmoor.test", affiliation: "Verrin Hills Ecology Group" },
  { orcid: "0000-0004-2718-302X", givenName: "Ines", familyName: "Okafor", email: "ines.okafor@northmoor.test", affiliation: "Tallow Coast Research Unit" },
  { orcid: "0000-0004-2718-3038", givenName: "Pavel", familyName: "Strand", email: "pavel.strand@northmoor.test", affiliation: "Lake Osk Institute" },
  { orcid: "0000-0004-2718-3046", givenName: "Tomas", familyName: "Brand", email: "curator.brand@northmoor.test", affiliation: "Northmoor Field Station" },
  { orcid: "0000-0004-2718-3054", givenName: "Maren", familyName: "Ilves", email: "curator.ilves@northmoor.test", affiliation: "Lake Osk Institute" },
  { orcid: "0000-0004-2718-3062", givenName: "Ada", familyName: "Quillfeather", email: "admin@northmoor.test", affiliation: "Northmoor Field Station" },
  { orcid: "0000-0004-2718-3070", givenName: "Lior", familyName: "Vantelle", affiliation: "Northmoor Field Station" },
];

/** The made-up iD of a demo person by display name ("Rowan Hale"), if any. */
export function demoOrcidOf(displayName: string): string | undefined {
  return DEMO_RESEARCHERS.find((r) => `${r.givenName} ${r.familyName}` === displayName)?.orcid;
}
