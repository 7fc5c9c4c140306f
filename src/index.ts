/**
 * lapwright library entry: `generateTrack(request)` and `validateTrack(track)`, their types and
 * typed errors. See README "Library".
 */
export * from './core/index.js';
