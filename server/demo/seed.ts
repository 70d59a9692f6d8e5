import { randomUUID } from 'node:crypto'
import type { Role } from '#shared/schemas/user'
import { hashPassword } from '../auth/passwords.ts'
import { currentSettings, updateSettings } from '../settings/settings.service.ts'
import { getUser } from '../users/users.service.ts'
import { MembershipModel, TeamModel, UserModel } from '../models/index.ts'
import { seedDemoExams } from './demo-exams.ts'
import { seedDemoPairs } from './demo-pairs.ts'
import { seedDemoRound } from './demo-rounds.ts'
import { seedDemoLoop } from './demo-loop.ts'
import { seedDemoReferences } from './demo-references.ts'

export const DEMO_PASSWORD = 'bedside-demo'

const TEAMS = ['Ward 7 North — Cardiology', 'Acute Medical Unit', 'Medical ICU'] as const
type TeamName = (typeof TEAMS)[number]

interface DemoAccount {
  email: string
  displayName: string
  roles: Role[]
  teams: TeamName[]
}

// Invented staff of the invented Saltmarsh Teaching Hospital.
const ACCOUNTS: DemoAccount[] = [
  { email: 'admin@saltmarsh.test', displayName: 'Morgan Reyes', roles: ['admin'], teams: [] },
  { email: 'educator@saltmarsh.test', displayName: 'Dr Hana Okafor', roles: ['educator'], teams: [] },
  { email: 'attending@saltmarsh.test', displayName: 'Dr Tomas Lindqvist', roles: ['attending'], teams: ['Ward 7 North — Cardiology'] },
  { email: 'attending2@saltmarsh.test', displayName: 'Dr Priya Raman', roles: ['attending'], teams: ['Acute Medical Unit', 'Medical ICU'] },
  { email: 'resident@saltmarsh.test', displayName: 'Dr Sam Whitcombe', roles: ['resident'], teams: ['Ward 7 North — Cardiology'] },
  { email: 'resident2@saltmarsh.test', displayName: 'Dr Aiko Brennan', roles: ['resident'], teams: ['Ward 7 North — Cardiology'] },
  { email: 'resident3@saltmarsh.test', displayName: 'Dr Lewis Achebe', roles: ['resident'], teams: ['Acute Medical Unit'] },
  { email: 'resident4@saltmarsh.test', displayName: 'Dr Ines Carvalho', roles: ['resident'], teams: ['Acute Medical Unit'] },
  { email: 'resident5@saltmarsh.test', displayName: 'Dr Noah Fitzgerald', roles: ['resident'], teams: ['Medical ICU'] },
  { email: 'resident6@saltmarsh.test', displayName: 'Dr Mei Tanaka', roles: ['resident'], teams: ['Medical ICU'] },
]

/**
 * Photos are off in a new deployment until a hospital has agreed consent and storage; the demo shows them, so its
 * admin switches them on once, as an audited settings change like any other.
 */
async function allowDemoPhotos(): Promise<void> {
  const current = await currentSettings()
  if (current.version !== 1 || current.values.photosAllowed) return
  const admin = await UserModel.findOne({ where: { email: 'admin@saltmarsh.test' } })
  const user = admin && (await getUser(admin.id))
  if (user) await updateSettings(user, { ...current.values, photosAllowed: true, baseVersion: current.version })
}

/** Creates the demo hospital's teams, accounts and exams that are missing; running it twice changes nothing. */
export async function seedDemo(): Promise<{ created: number; exams: number }> {
  const teamIds = new Map<string, string>()
  for (const name of TEAMS) {
    const [team] = await TeamModel.findOrCreate({ where: { name }, defaults: { id: randomUUID(), name } })
    teamIds.set(name, team.id)
  }
  let created = 0
  // One hash for every account: the password is public anyway, and each bcrypt hash costs a few hundred milliseconds.
  let passwordHash: string | undefined
  for (const a of ACCOUNTS) {
    if (await UserModel.findOne({ where: { email: a.email } })) continue
    const user = await UserModel.create({
      id: randomUUID(),
      email: a.email,
      displayName: a.displayName,
      passwordHash: (passwordHash ??= await hashPassword(DEMO_PASSWORD)),
      roles: a.roles,
    })
    await MembershipModel.bulkCreate(a.teams.map((t) => ({ userId: user.id, teamId: teamIds.get(t)! })))
    created += 1
  }
  await allowDemoPhotos()
  const exams = await seedDemoExams(teamIds)
  await seedDemoPairs(teamIds)
  await seedDemoRound(teamIds)
  await seedDemoLoop(teamIds)
  await seedDemoReferences(new Map([...teamIds].map(([name, id]) => [id, name])))
  return { created, exams }
}
