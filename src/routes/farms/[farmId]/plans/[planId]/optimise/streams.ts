// The page's talk with the optimiser API: JSON answers and the trade-off's stream of lines.

export const connectionMessage =
	'The server could not be reached: check the connection and try again.';

/** Calls `online` with each JSON line of an `application/x-ndjson` body as it arrives. */
export async function readLines<T>(response: Response, online: (line: T) => void) {
	const reader = response.body!.pipeThrough(new TextDecoderStream()).getReader();
	let rest = '';
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		rest += value;
		const lines = rest.split('\n');
		rest = lines.pop()!;
		for (const line of lines) if (line.trim()) online(JSON.parse(line) as T);
	}
	if (rest.trim()) online(JSON.parse(rest) as T);
}

/** Starts a download of a body the browser fetched (the LP file is a POST, so no plain link). */
export async function download(response: Response, fallbackName: string) {
	const disposition = response.headers.get('Content-Disposition') ?? '';
	const name = /filename="?([^";]+)"?/.exec(disposition)?.[1] ?? fallbackName;
	const link = document.createElement('a');
	link.href = URL.createObjectURL(await response.blob());
	link.download = name;
	link.click();
	URL.revokeObjectURL(link.href);
}
