// Main-thread responsiveness while a file loads: a requestAnimationFrame loop records the longest gap between
// frames, and a 50 ms timer records how late it fires. Both stay small when all parsing runs in the worker.

export interface HeartbeatStats {
  frames: number;
  max_frame_gap_ms: number;
  /** when the longest gap ended, ms after the heartbeat started */
  max_frame_gap_at_ms: number;
  timer_ticks: number;
  max_timer_late_ms: number;
  /** frames with a gap above 100 ms */
  long_frames: number;
}

export function startHeartbeat(): () => HeartbeatStats {
  const stats: HeartbeatStats = { frames: 0, max_frame_gap_ms: 0, max_frame_gap_at_ms: 0, timer_ticks: 0, max_timer_late_ms: 0, long_frames: 0 };
  let running = true;
  const started = performance.now();
  let last = started;
  const frame = (now: number) => {
    if (!running) return;
    const gap = now - last;
    if (stats.frames > 0) {
      if (gap > stats.max_frame_gap_ms) {
        stats.max_frame_gap_ms = gap;
        stats.max_frame_gap_at_ms = now - started;
      }
      if (gap > 100) stats.long_frames++;
    }
    stats.frames++;
    last = now;
    requestAnimationFrame(frame);
  };
  requestAnimationFrame(frame);
  let expected = performance.now() + 50;
  const timer = setInterval(() => {
    const now = performance.now();
    const late = now - expected;
    if (late > stats.max_timer_late_ms) stats.max_timer_late_ms = late;
    stats.timer_ticks++;
    expected = now + 50;
  }, 50);
  return () => {
    running = false;
    clearInterval(timer);
    return { ...stats };
  };
}
