// Every vitest file: the services must be the ones db/test.sh started (never the `npm start` ones).
if (!process.env.DATABASE_URL || !process.env.MAIL_DIR || !process.env.DATABASE_URL.includes("/hl_test")) {
  throw new Error("Run the tests through `npm test` (db/test.sh), which starts throw-away PostgreSQL, Redis and mail catcher.");
}
