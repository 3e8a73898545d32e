import { z } from 'zod';

const id = z.string().min(1).max(100);

/** Path parameters of the routes, checked like any other input. */
export const teamParams = z.object({ teamId: id });
export const reviewParams = z.object({ reviewId: id });
export const invitationParams = z.object({ invitationId: id });
