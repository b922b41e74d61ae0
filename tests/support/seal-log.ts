// Seals every waiting leaf of the database in DATABASE_URL once (the worker does this every few seconds): for tests
// on scratch databases, which no worker watches. Run with tsx --conditions=react-server.
import { pool } from "@/db";
import { sealAll } from "@/lib/jobs/sealer";

try {
  const heads = await sealAll();
  console.log(`sealed ${heads.reduce((sum, head) => sum + head.leaves, 0)} leaves under ${heads.length} head(s)`);
} finally {
  await pool.end();
}
