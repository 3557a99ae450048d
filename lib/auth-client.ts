"use client";
import { createAuthClient } from "better-auth/react";

// Same origin as the page, so no base URL is needed.
export const authClient = createAuthClient();
