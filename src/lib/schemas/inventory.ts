import { z } from 'zod';
import { laserClasses, laserStatuses } from './register';

export const inventoryBands = ['uv', 'visible', 'nir', 'ir'] as const;
export const inventorySorts = ['model', 'maker', 'class', 'lab', 'status', 'updated'] as const;

/** Query string of GET /api/lasers; empty values mean "any". */
export const inventoryQuerySchema = z
	.object({
		q: z.string().trim().max(100, 'Search with at most 100 characters.').refine((t) => !t.includes('\u0000'), 'Search text cannot hold a NUL character.').optional(),
		lab: z.uuid({ error: 'Unknown lab.' }).optional(),
		class: z.enum(laserClasses, { error: 'Unknown laser class.' }).optional(),
		status: z.enum(laserStatuses, { error: 'Unknown status.' }).optional(),
		band: z.enum(inventoryBands, { error: 'Unknown wavelength band.' }).optional(),
		sort: z.enum(inventorySorts, { error: 'Unknown sort key.' }).default('model'),
		dir: z.enum(['asc', 'desc'], { error: 'Sort asc or desc.' }).default('asc'),
		page: z.coerce.number({ error: 'page must be a number.' }).int().min(1).max(100000).default(1),
		pageSize: z.coerce.number({ error: 'pageSize must be a number.' }).int().min(1).max(200).default(25)
	})
	.strict();

export type InventoryQueryInput = z.input<typeof inventoryQuerySchema>;
