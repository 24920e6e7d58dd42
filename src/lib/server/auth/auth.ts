import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { env } from '$env/dynamic/private';
import { signInSchema } from '$lib/schemas/account';
import { db, pool } from '$lib/server/db';
import { accounts, sessions, users, verificationTokens } from '$lib/server/db/schema';
import { insertAuditEntry } from '$lib/server/db/audit';
import { findUserByEmail } from '$lib/server/db/users';
import { sendMail } from '$lib/server/mail';
import { mailConfigFrom } from '$lib/server/mail/config';
import { signInLinkMail } from '$lib/server/mail/templates';
import { verifyPassword } from './password';
import { limitedSignIn, postgresFailedSignIns } from './sign-in-limiter';

const failedSignIns = postgresFailedSignIns(pool);

export const { handle, signIn, signOut } = SvelteKitAuth(async (event) => {
	const mail = mailConfigFrom(env);
	return {
		adapter: DrizzleAdapter(db, {
			usersTable: users,
			accountsTable: accounts,
			sessionsTable: sessions,
			verificationTokensTable: verificationTokens
		}),
		// Signed tokens, not database sessions: app servers stay stateless. The adapter is there for the
		// e-mailed sign-in link (its one-time tokens) and for accounts that link creates; stating the
		// strategy matters, as an adapter would otherwise switch sessions to the database.
		session: { strategy: 'jwt' as const },
		trustHost: true,
		// A refused sign-in is the user's mistake, shown on the form; everything else is logged.
		logger: {
			error(error) {
				if (!(error instanceof CredentialsSignin)) console.error(error);
			}
		},
		pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/check-email' },
		providers: [
			// Sign-in by e-mailed link: one-time token (stored hashed by Auth.js), valid for 24 hours, sent
			// through the app's one mail function. An address without an account gets one on first sign-in.
			Nodemailer({
				server: mail.transport,
				from: mail.from,
				maxAge: 24 * 60 * 60,
				async sendVerificationRequest({ identifier, url }) {
					const { subject, text, html } = signInLinkMail({ url, host: new URL(url).host });
					await sendMail({ to: identifier, subject, text, html });
				}
			}),
			Credentials({
				credentials: { email: {}, password: {} },
				async authorize(input) {
					const parsed = signInSchema.safeParse(input);
					if (!parsed.success) return null;
					const { email, password } = parsed.data;
					return limitedSignIn(failedSignIns, email, event.getClientAddress(), async () => {
						const user = await findUserByEmail(db, email);
						if (!user?.passwordHash || !(await verifyPassword(user.passwordHash, password))) {
							return null;
						}
						return { id: user.id, email: user.email, name: user.name };
					});
				}
			})
		],
		events: {
			// An account made by the sign-in link is registered like one made on the sign-up form.
			async createUser({ user }) {
				if (user.id) await insertAuditEntry(db, { userId: user.id, action: 'user.registered' });
			}
		},
		callbacks: {
			session({ session, token }) {
				if (token.sub) session.user.id = token.sub;
				return session;
			}
		}
	};
});
