/** Only paths on this site, so a crafted link cannot send someone elsewhere after sign-in. */
export function safeRedirect(target: string | null | undefined, fallback = '/farms'): string {
	return target && target.startsWith('/') && !target.startsWith('//') && !target.startsWith('/\\')
		? target
		: fallback;
}
