import { hashPassword } from '../server/auth/password';
import type { Role } from '../server/auth/roles';
import type { Db } from '../server/db/knex';
import { insertObservatory } from '../server/db/observatories';
import { insertPerson, type PersonRow } from '../server/db/people';
import { reestimateCampaign } from '../server/services/consensus/reestimate-campaign';
import { seedDemoCrowd } from './demo-crowd';
import { seedDemoSurvey } from './demo-survey';
import { createCampaign, createSurveyTeam } from './factories/campaigns';

// The demo scenario: an invented survey team, one live campaign, an account for every role, and an
// invented crowd whose verdicts have already been through the consensus.
// Everything here is made up for the demo; none of it describes a real survey or star.

export const DEMO_PASSWORD = 'dipdeck-demo';

export const DEMO_ACCOUNTS: { email: string; displayName: string; role: Role }[] = [
  { email: 'volunteer@demo.dipdeck.test', displayName: 'Vera Volunteer', role: 'volunteer' },
  { email: 'moderator@demo.dipdeck.test', displayName: 'Milo Moderator', role: 'moderator' },
  { email: 'scientist@demo.dipdeck.test', displayName: 'Dr Sana Scientist', role: 'scientist' },
  { email: 'admin@demo.dipdeck.test', displayName: 'Ada Admin', role: 'admin' },
];

export const DEMO_TEAM = {
  name: 'Larkspur Transit Survey',
  description:
    'A small invented team that watches one patch of sky with a space photometer and asks volunteers to look for dips the period search missed.',
};

export const DEMO_CAMPAIGN = {
  name: 'Larkspur Field A, first season',
  description:
    'Twenty-seven days of brightness measurements for a few hundred stars. Swipe right when you see a dip, left when the star stays flat; tap where the dip is deepest.',
};

/** Three invented observatories, one per latitude band, so that transit windows have somewhere to be watched from. */
export const DEMO_OBSERVATORIES = [
  { name: 'Larkspur Ridge 1.0 m', latitudeDeg: 31.9583, longitudeDeg: -111.5967, elevationM: 2096 },
  { name: 'Quillan Hill 0.6 m', latitudeDeg: -30.1691, longitudeDeg: -70.8063, elevationM: 2207 },
  { name: 'Fenmoor roof 0.3 m', latitudeDeg: 52.2053, longitudeDeg: 0.1218, elevationM: 20 },
].map((observatory) => ({ ...observatory, minTargetAltitudeDeg: 30, sunAltitudeLimitDeg: -12 }));

export async function seedDemo(db: Db, options: { targets: number } = { targets: 240 }): Promise<void> {
  // Hashes in parallel (each costs ~0.6 s), rows in a fixed order so that ids are the same every time.
  const hashes = await Promise.all(DEMO_ACCOUNTS.map(() => hashPassword(DEMO_PASSWORD)));
  const people: PersonRow[] = [];
  for (const [index, account] of DEMO_ACCOUNTS.entries()) {
    const person = await insertPerson(db, { ...account, passwordHash: hashes[index]!, creditByName: true });
    if (!person) throw new Error(`demo account ${account.email} already exists`);
    people.push(person);
  }
  const scientist = people.find((person) => person.role === 'scientist');
  const teamId = await createSurveyTeam(db, DEMO_TEAM.name, DEMO_TEAM.description);
  const campaignId = await createCampaign(db, {
    ...DEMO_CAMPAIGN,
    status: 'live',
    surveyTeamId: teamId,
    createdBy: scientist?.id ?? null,
  });
  const { survey } = await seedDemoSurvey(db, { campaignId, targetCount: options.targets });
  await seedDemoCrowd(db, { campaignId, targets: survey.targets, passwordHash: hashes[0]! });
  // What the consensus jobs would have made of the crowd's verdicts by now.
  await reestimateCampaign(db, campaignId);
  for (const observatory of DEMO_OBSERVATORIES) {
    await insertObservatory(db, { ...observatory, createdBy: scientist?.id ?? people[0]!.id });
  }
}
