CREATE TABLE "captured_mail" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"envelope_from" text NOT NULL,
	"envelope_to" text[] NOT NULL,
	"subject" text NOT NULL,
	"text" text NOT NULL,
	"html" text,
	"raw" text NOT NULL
);
--> statement-breakpoint
CREATE INDEX "captured_mail_received_at_index" ON "captured_mail" USING btree ("received_at");