import { createApp } from './app';
import { prepareRuntime } from './bootstrap';
import { ConfigError, loadConfig } from './config/env';
import { createLogger } from './lib/logger';

async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config.logLevel, config.nodeEnv === 'development');
  const runtime = await prepareRuntime(config, logger);
  const app = createApp(runtime.ctx);
  // Queued e-mail goes out within a second; a restart resumes where the last process stopped.
  runtime.delivery.start(1000);
  // Reminders: the overdue check once a day, the planners' digest at REMINDER_HOUR.
  runtime.scheduler.start();
  const server = app.listen(config.port, config.host, () => {
    logger.info(
      { port: config.port, dataDir: config.dataDir },
      `Emberline is ready at http://localhost:${config.port}`,
    );
  });
  server.on('error', (error: NodeJS.ErrnoException) => {
    logger.fatal(
      error.code === 'EADDRINUSE'
        ? `Port ${config.port} is already in use: set PORT to another one`
        : error.message,
    );
    process.exit(1);
  });
  const shutdown = () => {
    logger.info('shutting down');
    server.close(() => {
      void runtime.close().then(() => process.exit(0));
    });
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.on('SIGTERM', shutdown);
  process.on('SIGINT', shutdown);
}

main().catch((error: unknown) => {
  console.error(
    error instanceof ConfigError ? error.message : error instanceof Error ? error.message : error,
  );
  process.exit(1);
});
