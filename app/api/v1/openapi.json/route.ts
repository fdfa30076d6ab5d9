import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { openApiDocument } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The API's OpenAPI 3.1 document; public (it describes, it reveals no data). */
export const GET = route(async () => NextResponse.json(openApiDocument()));
