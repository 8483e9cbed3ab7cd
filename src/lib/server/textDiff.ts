// What changed between two versions of a procedure's text, line by line (jsdiff), with long runs of
// unchanged lines folded so the changes stand out. Pure: no I/O.
import { diffLines } from 'diff';

export type DiffBlock = { kind: 'same' | 'added' | 'removed'; lines: string[] } | { kind: 'folded'; count: number };

/** Unchanged lines kept around each change; longer unchanged runs are folded. */
const CONTEXT = 2;

export function lineDiff(before: string, after: string): { blocks: DiffBlock[]; added: number; removed: number } {
	// Same line endings, and a final newline on both, so only real edits show.
	const norm = (t: string) => t.replace(/\r\n?/g, '\n').replace(/\n?$/, '\n');
	const parts = diffLines(norm(before), norm(after));
	const blocks: DiffBlock[] = [];
	let added = 0;
	let removed = 0;
	parts.forEach((part, i) => {
		const lines = part.value.replace(/\n$/, '').split('\n');
		if (part.added || part.removed) {
			blocks.push({ kind: part.added ? 'added' : 'removed', lines });
			if (part.added) added += lines.length;
			else removed += lines.length;
			return;
		}
		const first = i === 0;
		const last = i === parts.length - 1;
		const keepHead = first ? 0 : CONTEXT;
		const keepTail = last ? 0 : CONTEXT;
		if (lines.length <= keepHead + keepTail + 1) {
			blocks.push({ kind: 'same', lines });
			return;
		}
		if (keepHead) blocks.push({ kind: 'same', lines: lines.slice(0, keepHead) });
		blocks.push({ kind: 'folded', count: lines.length - keepHead - keepTail });
		if (keepTail) blocks.push({ kind: 'same', lines: lines.slice(lines.length - keepTail) });
	});
	return { blocks, added, removed };
}
