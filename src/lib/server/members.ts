// What the members page and the members/invitations API share: sending an invitation, and the words
// of each refusal.
import type { InvitationInput } from '$lib/schemas/invitations';
import { db } from '$lib/server/db';
import { createInvitation, type InvitationView } from '$lib/server/db/invitations';
import { invitationPath } from '$lib/server/invitations';
import { invitationMail, sendMail } from '$lib/server/mail';

export const invitationRefusals = new Map([
	['member', 'This person is already a member of the farm.'],
	['pending', 'An invitation to this address is still waiting. Revoke it first to send a new one.'],
	['mail', 'The invitation could not be e-mailed, so it was not saved. Try again in a few minutes.']
] as const);

export const memberRefusals = new Map([
	['not-found', 'This person is not a member of the farm.'],
	['last-owner', 'A farm keeps at least one owner: make someone else an owner first.']
] as const);

export const closedInvitationRefusal = 'This invitation has already been used or revoked.';

/** The mail could not be sent: the invitation's transaction is rolled back. */
class MailNotSent extends Error {}

/** Saves an invitation and e-mails its link, both or neither. */
export async function inviteByEmail(input: {
	farm: { id: string; name: string };
	inviter: { id: string; name: string | null; email: string };
	invitation: InvitationInput;
	origin: string;
}): Promise<
	{ ok: true; invitation: InvitationView } | { ok: false; refused: 'member' | 'pending' | 'mail' }
> {
	try {
		const result = await createInvitation(
			db,
			{ farmId: input.farm.id, invitedById: input.inviter.id, ...input.invitation },
			async (token, invitation) => {
				const mail = invitationMail({
					farmName: input.farm.name,
					role: invitation.role,
					invitedBy: input.inviter.name
						? `${input.inviter.name} (${input.inviter.email})`
						: input.inviter.email,
					url: new URL(invitationPath(token), input.origin).href,
					expiresAt: invitation.expiresAt
				});
				try {
					await sendMail({ to: invitation.email, ...mail });
				} catch (err) {
					console.error(`The invitation to ${invitation.email} could not be e-mailed.`, err);
					throw new MailNotSent();
				}
			}
		);
		return result.ok ? { ok: true, invitation: result.invitation } : result;
	} catch (err) {
		if (err instanceof MailNotSent) return { ok: false, refused: 'mail' };
		throw err;
	}
}
