import { startMailCatcher } from './mail-catcher';

/** `node apps/api/dist/dev-mail/main.js`: the development SMTP catch-all that `npm start` runs. */
async function main(): Promise<void> {
  const catcher = await startMailCatcher({
    smtpPort: Number(process.env.KW_SMTP_PORT ?? 2525),
    httpPort: Number(process.env.KW_MAIL_VIEW_PORT ?? 2580),
  });
  console.log(
    `mail catch-all: SMTP 127.0.0.1:${catcher.smtpPort}, view http://127.0.0.1:${catcher.httpPort}/`,
  );
  const stop = () => void catcher.stop().then(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
