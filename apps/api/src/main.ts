import { createApp } from './app.js';
import { ConfigError, parseEnv } from './config/env.js';

async function main(): Promise<void> {
  const env = parseEnv();
  const app = await createApp(env);
  await app.listen(env.PORT, env.HOST);
  console.log(`[api] listening on http://${env.HOST}:${env.PORT}`);
}

main().catch((error: unknown) => {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
});
