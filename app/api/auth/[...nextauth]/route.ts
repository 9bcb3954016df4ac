import NextAuth from "next-auth";
import type { NextRequest } from "next/server";
import { authOptions } from "@/lib/auth/options";
import { authRoute } from "@/lib/api/auth-route";

const nextAuth = NextAuth(authOptions) as (request: NextRequest, ctx: { params: Promise<{ nextauth: string[] }> }) => Promise<Response>;

const handlers = authRoute(nextAuth);
export const GET = handlers.GET;
export const POST = handlers.POST;
