import { error, fail, redirect } from '@sveltejs/kit';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { maxCsvBytes, readCsvFile, type CsvProblem } from '$lib/server/csv-upload';
import { uploads, type Preview } from '$lib/server/uploads';
import type { Actions, PageServerLoad } from './$types';

// Two steps, each a plain form post so they work without JavaScript: `preview` reads the file and shows
// its rows with every problem; `import` reads the same text again (sent back from the preview) and
// imports it all in one transaction, or nothing.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const upload = uploadOr404(event.params.kind);
	return {
		farm: { id: farm.id, name: farm.name },
		kind: event.params.kind,
		title: upload.title,
		listPath: upload.listPath,
		note: upload.note,
		columns: upload.csv.columns.map(({ name, required }) => ({ name, required })),
		maxMb: maxCsvBytes / 1_000_000
	};
}) satisfies PageServerLoad;

export const actions = {
	preview: async (event) => {
		const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const upload = uploadOr404(event.params.kind);
		const file = await readCsvFile((await event.request.formData()).get('file'));
		if (!file.ok) return fail(400, { problems: [file.problem] });
		const preview = shown(await upload.preview(db, farm.id, file.text), file.text);
		return preview.problems.length ? fail(400, preview) : preview;
	},
	import: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const upload = uploadOr404(event.params.kind);
		const text = (await event.request.formData()).get('csv');
		if (typeof text !== 'string') return fail(400, { problems: [noFile] });
		const result = await upload.importText(db, farm.id, user.id, text);
		if ('refused' in result) return fail(400, shown(result.refused, text));
		redirect(303, `/farms/${farm.id}/${upload.listPath}?imported=${result.imported}`);
	}
} satisfies Actions;

const noFile: CsvProblem = { row: null, column: null, message: 'Choose a CSV file to upload.' };

/** The preview as the page shows it, with the text to send back when it can be imported. */
function shown(preview: Preview, text: string) {
	// The first rows are enough to see the file was read right; problems are listed for every row.
	const shownRows = 200;
	return {
		header: preview.header,
		rows: preview.cells.slice(0, shownRows),
		rowCount: preview.cells.length,
		problems: preview.problems,
		csv: preview.problems.length ? null : text
	};
}

function uploadOr404(kind: string) {
	const upload = uploads.get(kind);
	if (!upload) error(404, 'There is no such upload.');
	return upload;
}
