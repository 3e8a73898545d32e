-- Activity kinds use the words of the live events: `review.created` becomes `review:created`.
UPDATE "activity" SET "kind" = replace("kind", 'review.', 'review:') WHERE "kind" LIKE 'review.%';
