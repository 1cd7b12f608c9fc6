// Loaded into the API process by the Site-file benchmark (`node --import`), never by the app
// itself: while TT_CAPTURE_SQL names a file, every statement the API sends through `pg` is
// appended to it as a JSON line (text, values, which connection, when it started and ended), so
// the floor server can replay exactly the API's SQL. Without the variable it changes nothing.
import fs from 'node:fs';
import pgModule from 'pg';

const file = process.env.TT_CAPTURE_SQL;
if (file) {
  // Always called as original.call(this, …) / original.apply(this, …) below.
  // oxlint-disable-next-line typescript/unbound-method
  const original = pgModule.Client.prototype.query;
  let clients = 0;
  pgModule.Client.prototype.query = function capturedQuery(config, values, callback) {
    this.benchId ??= clients += 1;
    const text = typeof config === 'string' ? config : config.text;
    const params = typeof config === 'string' || !config.values ? values : config.values;
    const entry = { client: this.benchId, text, values: Array.isArray(params) ? params : [], start: performance.now() };
    const done = () => {
      entry.end = performance.now();
      fs.appendFileSync(file, JSON.stringify(entry, (_k, v) => (v instanceof Date ? v.toISOString() : v)) + '\n');
    };
    // The pool calls with a callback (as the last argument); a direct caller may take the promise.
    const last = typeof callback === 'function' ? 2 : typeof values === 'function' ? 1 : -1;
    if (last !== -1) {
      const args = [config, values, callback].slice(0, last + 1);
      const reply = args[last];
      args[last] = (...results) => {
        done();
        reply(...results);
      };
      return original.apply(this, args);
    }
    const result = original.call(this, config, values);
    if (result && typeof result.then === 'function') result.then(done, done);
    else done();
    return result;
  };
}
