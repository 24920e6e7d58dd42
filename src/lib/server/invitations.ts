// Invitation tokens and states: what the members page, the API and the accept page share.
import { createHash, randomBytes } from 'node:crypto';

/** An invitation's link works for 7 days (common practice for invitation links, no published source). */
export const INVITATION_DAYS = 7;

/** 32 random bytes (256 bits), base64url: 43 characters. */
const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

/** Only the SHA-256 of a token is stored: a copy of the database cannot be used to join a farm. */
export function hashInvitationToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

export function newInvitationToken(): { token: string; tokenHash: string } {
	const token = randomBytes(32).toString('base64url');
	return { token, tokenHash: hashInvitationToken(token) };
}

/** A string that could be a token at all; anything else is refused without a database look-up. */
export const isInvitationTokenShaped = (token: string) => TOKEN_PATTERN.test(token);

export const invitationExpiry = (from: Date) =>
	new Date(from.getTime() + INVITATION_DAYS * 24 * 60 * 60 * 1000);

export const invitationPath = (token: string) => `/invitations/${token}`;

export type InvitationStatus = 'pending' | 'expired' | 'accepted' | 'revoked';

/** Where an invitation stands at `now`: used and withdrawn come before out of date. */
export function invitationStatus(
	row: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date },
	now: Date
): InvitationStatus {
	if (row.acceptedAt) return 'accepted';
	if (row.revokedAt) return 'revoked';
	if (row.expiresAt.getTime() <= now.getTime()) return 'expired';
	return 'pending';
}

/** What the accept page says when a link no longer works, by the invitation's state. */
export const closedInvitationMessages = new Map<InvitationStatus | 'invalid', string>([
	[
		'invalid',
		'This invitation link is not valid. Check that the whole link was copied from the e-mail, or ask the farm’s owner for a new invitation.'
	],
	[
		'expired',
		'This invitation has expired: links work for 7 days. Ask the farm’s owner to send a new one.'
	],
	[
		'accepted',
		'This invitation has already been used. If it was you, the farm is on your farms page; otherwise ask the farm’s owner for a new one.'
	],
	[
		'revoked',
		'The farm’s owner has withdrawn this invitation. Ask them if you think that is a mistake.'
	]
]);
