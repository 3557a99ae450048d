// Each integration test file gets its own copy of the migrated, seeded database (PostgreSQL's
// CREATE DATABASE … TEMPLATE), so no file sees rows another file wrote.
import { randomBytes } from "node:crypto";
import { afterAll } from "vitest";
import { adminQuery } from "../support/db-admin";

const template = new URL(process.env.DATABASE_URL!);
const templateName = template.pathname.slice(1);
const copy = new URL(template);
copy.pathname = `/${templateName.slice(0, 40)}_f${randomBytes(4).toString("hex")}`;
const sql = (text: string) => adminQuery(template, text);

await sql(`create database ${copy.pathname.slice(1)} template ${templateName}`);
process.env.DATABASE_URL = copy.toString();

afterAll(async () => {
  const { pool } = await import("@/db");
  await pool.end().catch(() => {});
  await sql(`drop database if exists ${copy.pathname.slice(1)} with (force)`);
});
