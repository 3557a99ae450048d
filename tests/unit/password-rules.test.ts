// One set of password rules for every form and route that sets a password: the same codes for a
// short, a long and a common password wherever one is chosen.
import { describe, expect, it } from "vitest";
import { carerInviteFormSchemas, activateSchema } from "@/lib/validations/invitations";
import { acceptInviteFormSchema, acceptInviteSchema, changePasswordSchema, resetPasswordSchema } from "@/lib/validations/staff";
import { PASSWORD_MIN_LENGTH } from "@/lib/auth/password-rules";

const good = "river-lantern-quiet-morning";
const cases: [string, (password: string) => { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }][] = [
  ["patient activation", (p) => activateSchema.safeParse({ code: "ABCD-EFGH-JKMN", email: "a@b.example", password: p })],
  ["carer's new account", (p) => carerInviteFormSchemas.create.safeParse({ name: "Sam", password: p })],
  ["staff invitation (route)", (p) => acceptInviteSchema.safeParse({ token: "t".repeat(40), name: "Ines Varga", password: p })],
  ["staff invitation (form)", (p) => acceptInviteFormSchema.safeParse({ name: "Ines Varga", password: p, confirmPassword: p })],
  ["password change", (p) => changePasswordSchema.safeParse({ currentPassword: "x", newPassword: p, confirmPassword: p })],
  ["password reset", (p) => resetPasswordSchema.safeParse({ newPassword: p, confirmPassword: p })],
];

const codes = (r: ReturnType<(typeof cases)[number][1]>) => r.error?.issues.filter((i) => /password/i.test(String(i.path[0]))).map((i) => i.message) ?? [];

describe("every form that sets a password uses the one rule set", () => {
  it.each(cases)("%s", (_name, parse) => {
    expect(parse(good).success).toBe(true);
    expect(codes(parse("x".repeat(PASSWORD_MIN_LENGTH - 1)))).toEqual(["password_too_short"]);
    expect(codes(parse("x".repeat(257)))).toEqual(["password_too_long"]);
    // Common passwords are refused on every form, whatever their case (ASVS 6.2.4).
    expect(codes(parse("PasswordPassword"))).toEqual(["password_too_common"]);
    expect(codes(parse("qwerty123456"))).toEqual(["password_too_common"]);
  });

  it("the forms that ask twice say when the two differ", () => {
    expect(resetPasswordSchema.safeParse({ newPassword: good, confirmPassword: `${good}!` }).error?.issues.map((i) => i.message)).toEqual(["password_mismatch"]);
  });
});
