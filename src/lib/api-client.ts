import { createApiClient } from './create-api-client';
import { session } from './session';

export { ApiError } from './api-error';

/** The browser's client: same origin, so the dev proxy or the web server answers /api. */
export const api = createApiClient({ baseUrl: '', session });
