/**
 * Demo accounts of the invented Northmoor Field Station scenario (development only). Idempotent: an
 * account that exists is left as it is.
 */
import { User } from "../../models";
import type { Role } from "../../models/user.model";
import { hashPassword } from "../../lib/passwords";

export interface DemoAccount {
  email: string;
  password: string;
  displayName: string;
  role: Role;
  affiliation: string;
}

export const DEMO_PASSWORD = "northmoor-demo-2024";

export const DEMO_ACCOUNTS: DemoAccount[] = [
  { email: "admin@northmoor.test", password: DEMO_PASSWORD, displayName: "Ada Quillfeather", role: "admin", affiliation: "Northmoor Field Station" },
  { email: "curator.brand@northmoor.test", password: DEMO_PASSWORD, displayName: "Tomas Brand", role: "curator", affiliation: "Northmoor Field Station" },
  { email: "curator.ilves@northmoor.test", password: DEMO_PASSWORD, displayName: "Maren Ilves", role: "curator", affiliation: "Lake Osk Institute" },
  { email: "rowan.hale@northmoor.test", password: DEMO_PASSWORD, displayName: "Rowan Hale", role: "depositor", affiliation: "Verrin Hills Ecology Group" },
  { email: "ines.okafor@northmoor.test", password: DEMO_PASSWORD, displayName: "Ines Okafor", role: "depositor", affiliation: "Tallow Coast Research Unit" },
  { email: "pavel.strand@northmoor.test", password: DEMO_PASSWORD, displayName: "Pavel Strand", role: "depositor", affiliation: "Lake Osk Institute" },
];

export async function seedDemoAccounts(): Promise<number> {
  let created = 0;
  for (const a of DEMO_ACCOUNTS) {
    const exists = await User.findOne({ where: { email: a.email } });
    if (exists) continue;
    await User.create({
      email: a.email,
      passwordHash: await hashPassword(a.password),
      displayName: a.displayName,
      role: a.role,
      affiliation: a.affiliation,
      emailVerifiedAt: new Date(),
    });
    created++;
  }
  return created;
}
