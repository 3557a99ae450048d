"use client";
import { twoFactorClient } from "better-auth/client/plugins";
import { createAuthClient } from "better-auth/react";

// Same origin as the page, so no base URL is needed. The sign-in form itself sends a person with
// two-step sign-in on to the code page, so the plugin's redirect is not used.
export const authClient = createAuthClient({ plugins: [twoFactorClient()] });
