import pg from "pg";

/** Runs one statement on the server's maintenance database (CREATE/DROP DATABASE cannot run in the database itself). */
export async function adminQuery(databaseUrl: string | URL, text: string) {
  const admin = new URL(databaseUrl);
  admin.pathname = "/postgres";
  const client = new pg.Client({ connectionString: admin.toString() });
  await client.connect();
  try {
    await client.query(text);
  } finally {
    await client.end();
  }
}
