// Tests for src/export/json.ts: the track as it is, one line or indented, ending in a newline.

import { describe, expect, it } from 'vitest';
import { trackToJson } from '../../src/export/json.js';
import { stadiumTrack } from '../helpers/synthetic-track.js';

describe('trackToJson', () => {
  const track = stadiumTrack();

  it('one line by default, the same bytes as JSON.stringify, then a newline', () => {
    expect(trackToJson(track)).toBe(JSON.stringify(track) + '\n');
  });

  it('pretty indents by two spaces and parses back to the same track', () => {
    const text = trackToJson(track, { pretty: true });
    expect(text).toBe(JSON.stringify(track, null, 2) + '\n');
    expect(JSON.parse(text)).toEqual(track);
  });
});
