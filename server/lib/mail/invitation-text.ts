// The words of an invitation e-mail. It greets the person by name when the inviter
// gave one (the name is a checked one-line name: shared/schemas/text.ts).
import type { Role } from '#shared/auth/roles'
import { ROLE_LABELS } from '#shared/auth/roles'

export interface InvitationWords { name?: string | null, role: Role, cohortName?: string | null, link: string }

export function invitationText(w: InvitationWords): string {
  const name = w.name?.trim()
  return [
    name ? `Hello ${name},` : 'Hello,',
    '',
    `You have been invited to Cyclodial as a ${ROLE_LABELS[w.role].toLowerCase()}${w.cohortName ? ` in the ${w.cohortName}` : ''}.`,
    'Cyclodial is where you practise measuring and recording cyclotorsion with the double Maddox rod test on virtual patients.',
    '',
    name ? 'Open this link within 7 days to check your name and choose your password:' : 'Open this link within 7 days to choose your name and password:',
    w.link,
    '',
    'The link works once. If you were not expecting it, you can ignore this message.',
  ].join('\n')
}
