import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalSnapshot, groupedChecksum, snapshotChecksum, type SnapshotRecord } from './snapshotChecksum';

const base: SnapshotRecord = {
	id: '00000000-0000-4000-8000-000000000001',
	pathId: '00000000-0000-4000-8000-000000000002',
	pathVersion: 3,
	engineVersion: '2.4.0',
	inputs: { path: { lines: [{ wavelength: '5.32e-7' }] }, limits: [] },
	result: { verdict: 'exceeds_limit', worstRatio: 12.5, nested: { b: 1, a: [2, 1] } },
	verdict: 'exceeds_limit',
	worstRatio: '12.5',
	requiredOd: '1.1',
	limitVersions: [{ id: 'L1', version: '2' }],
	cause: 'save',
	createdBy: 'u1',
	createdAt: new Date('2026-11-30T10:00:00.000Z')
};

describe('snapshot checksum', () => {
	it('does not depend on the order of keys in the stored JSON', () => {
		const reordered = { ...base, result: { nested: { a: [2, 1], b: 1 }, worstRatio: 12.5, verdict: 'exceeds_limit' } };
		expect(snapshotChecksum(reordered)).toBe(snapshotChecksum(base));
	});

	it('is the SHA-256 of the canonical text, which sorts keys and has no spaces', () => {
		const text = canonicalSnapshot(base);
		expect(text.startsWith('{"cause":"save","createdAt":"2026-11-30T10:00:00.000Z","createdBy":"u1","engineVersion":"2.4.0","id":')).toBe(true);
		expect(text).toContain('"result":{"nested":{"a":[2,1],"b":1},"verdict":"exceeds_limit","worstRatio":12.5}');
		expect(snapshotChecksum(base)).toBe(createHash('sha256').update(text).digest('hex'));
		expect(snapshotChecksum(base)).toMatch(/^[0-9a-f]{64}$/);
	});

	it('changes when anything in the result changes, even an order inside an array', () => {
		expect(snapshotChecksum({ ...base, result: { ...(base.result as object), nested: { a: [1, 2], b: 1 } } })).not.toBe(snapshotChecksum(base));
		expect(snapshotChecksum({ ...base, worstRatio: '12.6' })).not.toBe(snapshotChecksum(base));
	});

	it('groups the hex in eights for reading off paper', () => {
		expect(groupedChecksum('a'.repeat(64)).split(' ')).toHaveLength(8);
	});
});
