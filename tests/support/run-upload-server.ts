// Runs tests/support/upload-server.ts as its own process (the crash test kills it with SIGKILL):
// UPLOAD_SERVER_PORT picks the port; "listening" on stdout says it is ready.
import { startUploadServer } from "./upload-server";

const port = Number(process.env.UPLOAD_SERVER_PORT ?? 0);
startUploadServer(port).then(({ url }) => {
  process.stdout.write(`listening ${url}\n`);
});
