// The words of the path editor's fields, for messages a person reads: 'elements.1.transmission' is
// "Element 2, Transmission (0–1)", as the form numbers and labels it.
import type { loadNewPath, loadPath } from '$lib/server/pathForms';
export { elementFieldWords, fieldWords, pointFieldWords } from '$lib/pathFieldWords';

/** What both editor pages receive from their load function. */
export type EditorData = Awaited<ReturnType<typeof loadPath>> | Awaited<ReturnType<typeof loadNewPath>>;
