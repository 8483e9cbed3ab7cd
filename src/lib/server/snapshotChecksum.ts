// The checksum printed on every report: SHA-256 of the stored snapshot written as canonical JSON
// (RFC 8785, keys sorted, numbers in their shortest form), so a paper copy can be matched to the
// record. The stale flag and its reason are left out: they change after the snapshot was taken.
import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import type { Assessment } from '$lib/server/db/schema';

export type SnapshotRecord = Pick<Assessment, 'id' | 'pathId' | 'pathVersion' | 'engineVersion' | 'inputs' | 'result' | 'verdict' | 'worstRatio' | 'requiredOd' | 'limitVersions' | 'cause' | 'createdBy' | 'createdAt'>;

/** The snapshot as the JSON that is hashed. */
export function canonicalSnapshot(s: SnapshotRecord): string {
	const record = {
		id: s.id,
		pathId: s.pathId,
		pathVersion: s.pathVersion,
		engineVersion: s.engineVersion,
		inputs: s.inputs,
		result: s.result,
		verdict: s.verdict,
		worstRatio: s.worstRatio,
		requiredOd: s.requiredOd,
		limitVersions: s.limitVersions,
		cause: s.cause,
		createdBy: s.createdBy,
		createdAt: s.createdAt.toISOString()
	};
	const text = canonicalize(record);
	if (text === undefined) throw new Error('snapshot cannot be written as JSON');
	return text;
}

/** Lower-case hex SHA-256 of the canonical JSON. */
export function snapshotChecksum(s: SnapshotRecord): string {
	return createHash('sha256').update(canonicalSnapshot(s), 'utf8').digest('hex');
}

/** The checksum in groups of eight, easier to read off paper. */
export function groupedChecksum(hex: string): string {
	return hex.match(/.{1,8}/g)!.join(' ');
}
