// Fake S3 for local runs and tests: s3rver on loopback, files under the state folder, bucket made at start.
//   node scripts/fake-s3.mjs --port 4569 --directory .gusset/s3 --bucket gusset [--parent-pid N]
// Credentials: S3RVER / S3RVER (the only pair s3rver accepts).
import { parseArgs } from "node:util";
import S3rver from "s3rver";
import { exitOnSignals, exitWithParent } from "./lib/watch-parent.mjs";

const { values } = parseArgs({
  options: {
    port: { type: "string", default: "4569" },
    directory: { type: "string", default: ".gusset/s3" },
    bucket: { type: "string", default: "gusset" },
    "parent-pid": { type: "string" },
  },
});

// Browsers upload with presigned URLs from the app's origin: allow it.
const cors = `<CORSConfiguration><CORSRule>
  <AllowedOrigin>*</AllowedOrigin>
  <AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>POST</AllowedMethod>
  <AllowedMethod>HEAD</AllowedMethod><AllowedMethod>DELETE</AllowedMethod>
  <AllowedHeader>*</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>3000</MaxAgeSeconds>
</CORSRule></CORSConfiguration>`;

const server = new S3rver({
  address: "127.0.0.1",
  port: Number(values.port),
  directory: values.directory,
  silent: true,
  configureBuckets: [{ name: values.bucket, configs: [cors] }],
});

const { port } = await server.run();
console.log(`fake S3 on http://127.0.0.1:${port}, bucket ${values.bucket}, files in ${values.directory}`);

const stop = exitOnSignals(() => server.close());
exitWithParent(Number(values["parent-pid"]), stop);
