-- Two-step sign-in becomes the default for every organisation's staff. An organisation that did
-- not require it before must now be relaxed again by an admin, with a reason on record (the next
-- migration adds the reason columns and the check that holds it).
UPDATE "organisations" SET "require_two_factor" = true WHERE "require_two_factor" = false;
