import { error, fail, redirect } from '@sveltejs/kit';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { maxCsvBytes, readCsvFile, type CsvProblem } from '$lib/server/csv-upload';
import { uploads, type Upload } from '$lib/server/uploads';
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
		await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const upload = uploadOr404(event.params.kind);
		const file = await readCsvFile((await event.request.formData()).get('file'));
		if (!file.ok) return fail(400, { problems: [file.problem] });
		const preview = previewOf(upload, file.text);
		return preview.problems.length ? fail(400, preview) : preview;
	},
	import: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const upload = uploadOr404(event.params.kind);
		const text = (await event.request.formData()).get('csv');
		if (typeof text !== 'string') return fail(400, { problems: [noFile] });
		const result = await upload.importText(db, farm.id, user.id, text);
		if ('refused' in result) return fail(400, previewOf(upload, text));
		if ('duplicates' in result) {
			const problem = duplicatesProblem(upload.csv.noun, result.duplicates);
			return fail(409, { ...previewOf(upload, text), problems: [problem], csv: null });
		}
		redirect(303, `/farms/${farm.id}/${upload.listPath}?imported=${result.imported}`);
	}
} satisfies Actions;

const noFile: CsvProblem = { row: null, column: null, message: 'Choose a CSV file to upload.' };

function previewOf(upload: Upload, text: string) {
	const read = upload.read(text);
	// The first rows are enough to see the file was read right; problems are listed for every row.
	const shownRows = 200;
	return {
		header: read.header,
		rows: read.cells.slice(0, shownRows),
		rowCount: read.cells.length,
		problems: read.ok ? [] : read.problems,
		csv: read.ok ? text : null
	};
}

function duplicatesProblem(noun: string, names: string[]): CsvProblem {
	const listed = names.map((name) => `"${name}"`).join(', ');
	return {
		row: null,
		column: 'name',
		message: `Nothing was imported: these names repeat in the file or are ${noun} the farm has already: ${listed}. Rename or remove those rows.`
	};
}

function uploadOr404(kind: string) {
	const upload = uploads.get(kind);
	if (!upload) error(404, 'There is no such upload.');
	return upload;
}
