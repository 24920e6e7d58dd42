/**
 * The only handlers that answer a visitor who is not signed in, each with the reason. Every other
 * load, form action and API handler under src/routes must start by calling a guard.
 */
export const publicHandlers: { file: string; handlers: string[]; reason: string }[] = [
	{
		file: 'src/routes/+layout.server.ts',
		handlers: ['load'],
		reason: 'Tells every page, the sign-in page included, who (if anyone) is signed in.'
	},
	{
		file: 'src/routes/+page.server.ts',
		handlers: ['load'],
		reason: 'The front page is for visitors; it only sends a signed-in user on to their farms.'
	},
	{
		file: 'src/routes/signin/+page.server.ts',
		handlers: ['load', 'actions.default'],
		reason: 'Signing in is how a visitor becomes a user.'
	},
	{
		file: 'src/routes/register/+page.server.ts',
		handlers: ['load', 'actions.default'],
		reason: 'Creating an account is for someone who has none yet.'
	},
	{
		file: 'src/routes/signin/link/+page.server.ts',
		handlers: ['load', 'actions.default'],
		reason: 'Asking for an e-mailed sign-in link is how a visitor signs in without a password.'
	},
	{
		file: 'src/routes/invitations/[token]/+page.server.ts',
		handlers: ['load'],
		reason:
			'An invitee may have no account yet: the page says what the link offers (or why it no longer works) and sends them to sign up or sign in; joining (the action) needs a signed-in user.'
	},
	{
		file: 'src/routes/signout/+page.server.ts',
		handlers: ['load', 'actions.default'],
		reason: 'Signing out must work when the session has already ended; the page only redirects.'
	}
];
