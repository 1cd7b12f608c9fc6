// Preloaded into the API process by the upload benchmark (node --import, with an IPC channel):
// samples process.memoryUsage() every 20 ms and, asked with the message 'memory-probe', answers
// the current values and the peaks since it was last asked, then starts new peaks — so a run can
// tell the V8 heap from external (ArrayBuffer) memory and from the rest of RSS. (A message, not a
// signal: the API's shutdown hooks take SIGUSR2 as a request to stop.)
if (process.send) {
  let peak = process.memoryUsage();
  const timer = setInterval(() => {
    const now = process.memoryUsage();
    for (const k of Object.keys(now)) peak[k] = Math.max(peak[k], now[k]);
  }, 20);
  timer.unref();
  process.channel?.unref();
  process.on('message', (message) => {
    if (message !== 'memory-probe') return;
    const now = process.memoryUsage();
    for (const k of Object.keys(now)) peak[k] = Math.max(peak[k], now[k]);
    process.send?.({ memoryProbe: { now, peak } });
    peak = now;
  });
}
