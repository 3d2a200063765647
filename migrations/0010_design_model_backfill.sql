-- Every existing project's design model is its first-created model (a new project's first model becomes it on creation).
UPDATE "projects" p SET "design_model_id" = (
  SELECT m."id" FROM "site_models" m WHERE m."project_id" = p."id" ORDER BY m."created_at", m."id" LIMIT 1
) WHERE p."design_model_id" IS NULL;
