import { describe, expect, it } from 'vitest';
import { lineDiff } from './textDiff';

describe('line diff of procedure versions', () => {
	it('names added and removed lines, keeping the unchanged lines between', () => {
		const before = ['# Alignment', '', '1. Goggles on', '2. Low power', '3. Card', '4. Log', '5. Shutter', '6. Sign out', '7. Lights'].join('\n');
		const after = before.replace('2. Low power', '2. Lowest power the diode allows').replace('7. Lights', '7. Lights\n8. Tell the LSO');
		const d = lineDiff(before, after);
		expect(d.added).toBe(2);
		expect(d.removed).toBe(1);
		expect(d.blocks).toEqual([
			{ kind: 'same', lines: ['# Alignment', '', '1. Goggles on'] },
			{ kind: 'removed', lines: ['2. Low power'] },
			{ kind: 'added', lines: ['2. Lowest power the diode allows'] },
			{ kind: 'same', lines: ['3. Card', '4. Log', '5. Shutter', '6. Sign out', '7. Lights'] },
			{ kind: 'added', lines: ['8. Tell the LSO'] }
		]);
	});

	it('folds a long unchanged run between changes', () => {
		const lines = Array.from({ length: 20 }, (_, i) => `step ${i}`);
		const after = [...lines];
		after[0] = 'first step';
		after[19] = 'last step';
		const d = lineDiff(lines.join('\n'), after.join('\n'));
		expect(d.blocks.map((b) => (b.kind === 'folded' ? `folded ${b.count}` : `${b.kind} ${b.lines.length}`))).toEqual(['removed 1', 'added 1', 'same 2', 'folded 14', 'same 2', 'removed 1', 'added 1']);
	});

	it('is empty of changes for the same text, whatever the line endings', () => {
		const d = lineDiff('a\r\nb\r\n', 'a\nb\n');
		expect(d.added + d.removed).toBe(0);
	});
});
