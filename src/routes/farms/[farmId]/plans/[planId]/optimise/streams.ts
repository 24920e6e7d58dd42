// The page's talk with the optimiser API: the connection message and downloads.

export const connectionMessage =
	'The server could not be reached: check the connection and try again.';

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
