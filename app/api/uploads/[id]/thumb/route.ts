import { imageResponse } from '../serve';

// The photo's thumbnail, streamed from storage through the app.
export const GET = imageResponse('thumb');
