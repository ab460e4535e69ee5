/** Demo sew days for Kestrel Hollow Quilters: one in the library hall, one on video, with replies and chat. */
import type { Transaction } from 'sequelize';
import { ChatMessage, ChatRoom, Rsvp, SewDay, type User } from '../db/models';

const DAY = 86_400_000;

/** The next given weekday (0 = Sunday) at a UTC hour, at least `after` days from now. */
function next(weekday: number, hourUtc: number, after: number) {
  const d = new Date(Date.now() + after * DAY);
  d.setUTCHours(hourUtc, 0, 0, 0);
  while (d.getUTCDay() !== weekday) d.setTime(d.getTime() + DAY);
  return d;
}

export async function seedDemoSewDays(guildId: number, users: Map<string, User>, transaction: Transaction) {
  const person = (email: string) => users.get(email)!;
  const hall = await SewDay.create(
    {
      guildId,
      title: 'Geese border sew-along',
      startsAt: next(6, 16, 3),
      endsAt: new Date(next(6, 16, 3).getTime() + 5 * 3600_000),
      place: 'Kestrel Hollow library, community room (side door, ramp access)',
      videoUrl: null,
      notes:
        'Bring your geese pieces cut and a spare bobbin. Two pressing stations and one big cutting mat are set up; tea from 10.',
      createdById: person('coordinator@demo.test').id,
    },
    { transaction },
  );
  const video = await SewDay.create(
    {
      guildId,
      title: 'Evening hand-binding hour',
      startsAt: next(3, 0, 8),
      endsAt: new Date(next(3, 0, 8).getTime() + 2 * 3600_000),
      place: null,
      videoUrl: 'https://video.example.test/kestrel-hollow-binding',
      notes: 'Bring a quilt to bind or any hand work. Cameras optional.',
      createdById: person('admin@demo.test').id,
    },
    { transaction },
  );
  const replies: [SewDay, string, 'going' | 'maybe' | 'no'][] = [
    [hall, 'coordinator@demo.test', 'going'],
    [hall, 'member@demo.test', 'going'],
    [hall, 'walt@demo.test', 'maybe'],
    [hall, 'rosa@demo.test', 'going'],
    [hall, 'bea@demo.test', 'no'],
    [video, 'admin@demo.test', 'going'],
    [video, 'hana@demo.test', 'maybe'],
  ];
  for (const [day, email, answer] of replies)
    await Rsvp.create({ sewDayId: day.id, userId: person(email).id, answer }, { transaction });
  const hallRoom = await ChatRoom.create({ guildId, kind: 'sewday', sewDayId: hall.id, swapId: null }, { transaction });
  await ChatRoom.create({ guildId, kind: 'sewday', sewDayId: video.id, swapId: null }, { transaction });
  const chat: [string, string][] = [
    ['coordinator@demo.test', 'Room is booked from 10. I will bring the big mat and the 6½″ square ruler.'],
    ['member@demo.test', 'Can someone lend me a walking foot for the afternoon?'],
    ['rosa@demo.test', 'I have a spare one, Priya. Saving you a seat by the window.'],
  ];
  for (const [email, body] of chat)
    await ChatMessage.create({ roomId: hallRoom.id, authorId: person(email).id, body }, { transaction });
}
