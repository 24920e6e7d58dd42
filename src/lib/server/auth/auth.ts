import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import Credentials from '@auth/sveltekit/providers/credentials';
import { signInSchema } from '$lib/schemas/account';
import { db, pool } from '$lib/server/db';
import { accounts, sessions, users, verificationTokens } from '$lib/server/db/schema';
import { findUserByEmail } from '$lib/server/db/users';
import { verifyPassword } from './password';
import { limitedSignIn, postgresFailedSignIns } from './sign-in-limiter';

const failedSignIns = postgresFailedSignIns(pool);

export const { handle, signIn, signOut } = SvelteKitAuth(async (event) => ({
	adapter: DrizzleAdapter(db, {
		usersTable: users,
		accountsTable: accounts,
		sessionsTable: sessions,
		verificationTokensTable: verificationTokens
	}),
	// Signed tokens, not database sessions: app servers stay stateless.
	session: { strategy: 'jwt' as const },
	trustHost: true,
	// A refused sign-in is the user's mistake, shown on the form; everything else is logged.
	logger: {
		error(error) {
			if (!(error instanceof CredentialsSignin)) console.error(error);
		}
	},
	pages: { signIn: '/signin', error: '/signin' },
	providers: [
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
	callbacks: {
		session({ session, token }) {
			if (token.sub) session.user.id = token.sub;
			return session;
		}
	}
}));
