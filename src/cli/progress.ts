/**
 * Progress of a long command on stderr: on a terminal one line redrawn in place (a bar, count,
 * tracks/s and ETA, at most ten times a second); elsewhere (a log file, CI) a plain line at each
 * tenth of the work, so logs stay short and readable.
 */
import { performance } from 'node:perf_hooks';
import { type TextSink, writeText } from './io.js';

/** Redraws per second on a terminal, at most. */
const TTY_REDRAW_MS = 100;
/** Width of the bar, characters. */
const BAR_CHARS = 24;
/** Plain lines: one per this share of the work. */
const PLAIN_STEP = 0.1;

export class Progress {
  private readonly start = performance.now();
  private lastDraw = -Infinity;
  private nextPlain = PLAIN_STEP;
  private drawn = false;

  /**
   * @param sink stderr (isTTY picks the terminal form)
   * @param total units of work (tracks)
   * @param label the command, e.g. 'lapwright batch'
   * @param enabled false: print nothing (--quiet)
   */
  constructor(
    private readonly sink: TextSink,
    private readonly total: number,
    private readonly label: string,
    private readonly enabled = true,
  ) {}

  /** `done` units finished. */
  async tick(done: number): Promise<void> {
    if (!this.enabled || this.total === 0) return;
    const now = performance.now();
    if (this.sink.isTTY === true) {
      if (now - this.lastDraw < TTY_REDRAW_MS && done < this.total) return;
      this.lastDraw = now;
      this.drawn = true;
      await writeText(this.sink, `\r${this.line(done, now, true)}\x1b[K`);
    } else if (done / this.total >= this.nextPlain - 1e-9 || done === this.total) {
      while (this.nextPlain <= done / this.total + 1e-9) this.nextPlain += PLAIN_STEP;
      await writeText(this.sink, `${this.line(done, now, false)}\n`);
    }
  }

  /** Ends the terminal line (so the next message starts on its own line). */
  async finish(): Promise<void> {
    if (this.enabled && this.drawn) await writeText(this.sink, '\n');
  }

  /** Seconds since the start. */
  elapsedS(): number {
    return (performance.now() - this.start) / 1000;
  }

  private line(done: number, now: number, bar: boolean): string {
    const elapsed = (now - this.start) / 1000;
    const rate = elapsed > 0 ? done / elapsed : 0;
    const eta = rate > 0 ? (this.total - done) / rate : Infinity;
    const share = done / this.total;
    const filled = Math.round(share * BAR_CHARS);
    const head = bar ? `${this.label} [${'#'.repeat(filled)}${'.'.repeat(BAR_CHARS - filled)}]` : `${this.label}:`;
    return `${head} ${done}/${this.total} tracks (${Math.floor(share * 100)}%), ${rate.toFixed(1)} tracks/s, ETA ${formatSeconds(done === this.total ? 0 : eta)}`;
  }
}

/** `7 s`, `3 min 12 s`, `1 h 05 min`, or `?` before the first track. */
export function formatSeconds(s: number): string {
  if (!Number.isFinite(s)) return '?';
  const t = Math.round(s);
  if (t < 60) return `${t} s`;
  if (t < 3600) return `${Math.floor(t / 60)} min ${String(t % 60).padStart(2, '0')} s`;
  const m = Math.round(t / 60);
  return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
}
