/** The development ports of `npm start` and `npm run dev`, each changeable by its variable. */
export function devPorts(env: NodeJS.ProcessEnv = process.env): { appPort: number; idpPort: number; smtpPort: number; inboxPort: number } {
  const port = (name: string, fallback: number) => Number(env[name] ?? fallback);
  return {
    appPort: port('NODEWRIGHT_PORT', 4280),
    idpPort: port('NODEWRIGHT_IDP_PORT', 4281),
    smtpPort: port('NODEWRIGHT_SMTP_PORT', 4282),
    inboxPort: port('NODEWRIGHT_INBOX_PORT', 4283),
  };
}
