// /api/uploads: the tus 1.0.0 endpoint for recordings (POST, HEAD, PATCH, DELETE, OPTIONS) and
// GET /api/uploads/<id>, the outcome of one upload. Logic in lib/uploads/handle-upload-request.ts.
// Request bodies stream straight to the staging folder: no proxy.ts matcher may include this path.
import { handleUploadRequest } from "@/lib/uploads/handle-upload-request";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

// bound wrappers, never `server.handleWeb` itself: it is a method that needs its `this`
// (@tus/server source; docs/library-notes.md, "tus")
export const GET = (req: Request) => handleUploadRequest(req);
export const HEAD = (req: Request) => handleUploadRequest(req);
export const POST = (req: Request) => handleUploadRequest(req);
export const PATCH = (req: Request) => handleUploadRequest(req);
export const DELETE = (req: Request) => handleUploadRequest(req);
export const OPTIONS = (req: Request) => handleUploadRequest(req);
