// npm run mail:read -- ADDRESS [COUNT] — the mail the local catcher kept for one address, newest
// first, with its links. For developers on the machine that runs Fishplate without SMTP_URL (the
// demo): this is how a signed-out person reads their sign-in or password-reset link. It reads the
// database DATABASE_URL names; no page ever shows one person's sign-in mail to another.
import { closeDb, databasePath } from '@/db';
import { listCaughtMailTo } from '@/db/queries/caught-mail';
import { emailSchema } from '@/lib/validations/account';

const [addressArg, countArg] = process.argv.slice(2);
const address = emailSchema.safeParse(addressArg ?? '');
const count = Math.min(Math.max(Number(countArg ?? 5) || 5, 1), 50);
if (!address.success) {
  console.error('Usage: npm run mail:read -- ADDRESS [COUNT]   (e.g. npm run mail:read -- operator@fishplate.example)');
  process.exit(2);
}
const mail = listCaughtMailTo(address.data, count);
if (mail.length === 0) console.log(`No mail caught for ${address.data} in ${databasePath()}.`);
for (const m of mail) {
  console.log(`── ${m.receivedAt.toISOString()}  ${m.subject}\n${m.text.trim()}\n`);
}
closeDb();
