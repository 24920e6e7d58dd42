/**
 * The farm's record in plain words: what each audited action says, from its detail. An action this
 * list does not know yet reads as its own name with its detail's name, never as nothing.
 */
type Detail = Record<string, unknown>;

const str = (value: unknown) =>
	typeof value === 'string' || typeof value === 'number' ? String(value) : '';
const quoted = (value: unknown) => (str(value) ? `“${str(value)}”` : '');
const planVersion = (d: Detail) => `plan ${quoted(d.name)}, version ${str(d.version)}`;

const reviewKinds: Record<string, string> = {
	comment: 'commented on',
	approved: 'approved',
	changes_requested: 'asked for changes to'
};

const words: Record<string, (d: Detail) => string> = {
	'user.registered': () => 'created an account',
	'farm.created': () => 'created the farm',
	'farm.updated': () => "changed the farm's settings",
	'plan.imported': (d) => `imported the plan ${quoted(d.name)}`,
	'plan.created': (d) => `created the plan ${quoted(d.name)}`,
	'plan.saved': (d) => `saved ${planVersion(d)}`,
	'plan.restored': (d) => `restored version ${str(d.fromVersion)} as ${planVersion(d)}`,
	'plan.deleted': (d) => `deleted the plan ${quoted(d.name)}`,
	'plan.made-reference': (d) => `made ${quoted(d.name)} the reference plan`,
	'plan.shared': (d) => `shared ${planVersion(d)} for review`,
	'plan.reviewed': (d) => `${reviewKinds[str(d.kind)] ?? 'reviewed'} ${planVersion(d)}`,
	'herd.updated': (d) => `changed the herd (${str(d.head)} head)`,
	'herd.deleted': () => 'removed the herd',
	'fields.imported': (d) => `imported ${str(d.count)} fields`,
	'price-set.created': (d) => `added the ${str(d.year)} price set`,
	'price-set.updated': (d) => `changed the ${str(d.year)} price set`,
	'price-set.deleted': (d) => `deleted the ${str(d.year)} price set`
};

const verbs: Record<string, string> = {
	created: 'added',
	updated: 'changed',
	deleted: 'deleted',
	imported: 'imported',
	invited: 'invited',
	revoked: 'revoked',
	accepted: 'accepted'
};

/** "saved plan “Reduced N”, version 3"; "added the field “North flat”". */
export function describeAuditEntry(action: string, detail: Detail): string {
	const known = words[action];
	if (known) return known(detail);
	const [subject, verb] = action.split('.');
	const what = subject.replace(/-/g, ' ');
	const name = quoted(detail.name ?? detail.email);
	return `${verbs[verb] ?? verb ?? action} the ${what}${name ? ` ${name}` : ''}${
		detail.role ? ` as ${str(detail.role)}` : ''
	}`;
}
