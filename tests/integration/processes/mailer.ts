// A separate process that queues a batch of invitations and starts delivering them; the test
// kills it with SIGKILL part-way through.
import { deliverDueMail, enqueueMail } from '@/lib/mail/outbox';

const [countText = '60'] = process.argv.slice(2);
for (let i = 0; i < Number(countText); i++) {
  enqueueMail({ railwayId: null, dedupeKey: `crash-batch:${i}`, kind: 'invitation', toAddress: `crew${i}@test.example`, subject: `Invitation ${i}`, text: `Invitation ${i}` });
}
process.stdout.write('queued\n');
for (;;) {
  const { sent } = await deliverDueMail(5);
  if (sent === 0) break;
}
process.stdout.write('done\n');
