import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { freshDatabase } from '../test-db.ts';
import { db } from '../db/index.ts';
import { mail } from '../db/schema.ts';
import { readMessage, send, startCatcher, stopCatcher } from './index.ts';

const PORT = 2727; // vite.config.ts sets SMTP_PORT for the unit tests

beforeAll(async () => {
	await freshDatabase();
	await startCatcher();
});
afterAll(() => stopCatcher());

describe('local mail catcher', () => {
	it('keeps what Detune sends', async () => {
		expect(
			await send({
				kind: 'test',
				to: 'tech@example.com',
				subject: 'Due soon',
				text: 'Retest',
				html: '<p>Retest</p>',
				dedupeKey: 'k1'
			})
		).toBe('sent');
		await expect
			.poll(
				() =>
					db
						.select()
						.from(mail)
						.all()
						.filter((m) => m.kind === 'received').length
			)
			.toBe(1);
	});

	it('refuses mail from any other local program, with or without a guessed password', async () => {
		for (const auth of [undefined, { user: 'detune', pass: 'guess' }]) {
			const stranger = nodemailer.createTransport({
				host: '127.0.0.1',
				port: PORT,
				secure: false,
				ignoreTLS: true,
				...(auth ? { auth } : {})
			});
			await expect(
				stranger.sendMail({
					from: 'x@example.com',
					to: 'admin@example.com',
					subject: 'Looks official',
					text: 'Click here'
				})
			).rejects.toThrow();
			stranger.close();
		}
		expect(
			db
				.select()
				.from(mail)
				.all()
				.filter((m) => m.subject === 'Looks official')
		).toEqual([]);
	});

	it('reads subject and text in every encoding a mail program may use', async () => {
		// messages written by nodemailer's own composer (an independent writer), in each transfer
		// encoding; the first version decoded quoted-printable only and showed base64 as it came
		const composer = nodemailer.createTransport({ streamTransport: true, buffer: true });
		for (const textEncoding of ['quoted-printable', 'base64'] as const) {
			const info = await composer.sendMail({
				from: 'detune@example.com',
				to: 'tech@example.com',
				subject: 'Pumpe Ω läuft — Проверка',
				text: 'Retest at 1 180 rpm: 24.6 Hz ± 2 %.\nZeile zwei: Größe, Ж.',
				html: '<p>Retest</p>',
				textEncoding
			});
			const read = await readMessage(info.message as Buffer);
			expect(read.subject, textEncoding).toBe('Pumpe Ω läuft — Проверка');
			expect(read.text, textEncoding).toBe(
				'Retest at 1 180 rpm: 24.6 Hz ± 2 %.\nZeile zwei: Größe, Ж.'
			);
		}
	});
});
