import { imageResponse } from '../serve';

// The full, cleaned photo, streamed from storage through the app.
export const GET = imageResponse('image');
