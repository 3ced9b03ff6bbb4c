/**
 * The built product under test runs twice: the main server with its own local SMTP fake, and a
 * second one that sends through an SMTP relay at RELAY_PORT, which the outbox spec starts and stops
 * itself (a mail server that is down, then back).
 */
export const MAIN_PORT = Number(process.env.E2E_PORT ?? 8191);
export const RELAYED_PORT = MAIN_PORT + 3;
export const RELAY_PORT = MAIN_PORT + 4;
