import { applyAction } from '$app/forms';
import { invalidateAll } from '$app/navigation';
import type { SubmitFunction } from '@sveltejs/kit';

/**
 * `use:enhance={postInPlace}` for an upload form on a page with other forms being filled in: it posts
 * without a reload and shows the result before it reloads the page's data. In that order the page's
 * superforms see an action result that is not theirs and keep what is typed in them (SvelteKit's
 * default reloads first, which resets them to the server's data).
 */
export const postInPlace: SubmitFunction = () => {
	return async ({ result, formElement }) => {
		await applyAction(result);
		if (result.type === 'success') {
			formElement.reset();
			await invalidateAll();
		}
	};
};
