-- Custom SQL migration file, put your code below! --
-- Sessions are now stored under the SHA-256 of the cookie's token. Rows from before
-- hold the token itself: delete them (everyone signs in again once).
DELETE FROM "sessions";
