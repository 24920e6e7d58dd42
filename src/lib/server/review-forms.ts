// The review and share forms' schemas, adapted once (the form library caches per schema).
import { zod4 } from 'sveltekit-superforms/adapters';
import { reviewSchema, shareSchema } from '$lib/schemas/reviews';

export const reviewAdapter = zod4(reviewSchema);
export const shareAdapter = zod4(shareSchema);
