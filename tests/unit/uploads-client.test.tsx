// @vitest-environment happy-dom
/**
 * The browser side of photo uploads: the checks made before sending, and the uploader keeping the
 * chosen photos and showing the server's reason when an upload is refused. The "server" here is a
 * real HTTP listener on loopback that answers like the API does.
 */
import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { checkChosenFile, checkChosenFiles, MAX_PHOTO_BYTES } from '../../shared/schemas/photos';
import { PhotoUploader } from '../../src/components/photos/photo-uploader';

const jpeg = (name: string, size = 2048, type = 'image/jpeg') => new File([new Uint8Array(size)], name, { type });

describe('checks before sending', () => {
  it('passes photos and explains everything else, naming the file', () => {
    expect(checkChosenFile(jpeg('block.jpg'))).toBeNull();
    expect(checkChosenFile({ name: 'IMG_1.HEIC', size: 10, type: '' })).toBeNull(); // browsers often leave HEIC untyped
    expect(checkChosenFile({ name: 'notes.exe', size: 10, type: 'application/x-msdownload' })).toBe(
      '“notes.exe” is not a photo. Upload JPEG, PNG, WebP or HEIC pictures.',
    );
    expect(checkChosenFile({ name: 'logo.svg', size: 10, type: 'image/svg+xml' })).toMatch(/^“logo\.svg” is not a photo/);
    expect(checkChosenFile({ name: 'empty.jpg', size: 0, type: 'image/jpeg' })).toBe(
      '“empty.jpg” is empty (0 bytes). Choose the photo again.',
    );
    expect(checkChosenFile({ name: 'big.jpg', size: MAX_PHOTO_BYTES + 1, type: 'image/jpeg' })).toMatch(
      /^“big\.jpg” is 15\.0 MB, more than the 15 MB/,
    );
    const eleven = Array.from({ length: 11 }, (_, i) => ({ name: `${i}.jpg`, size: 1, type: 'image/jpeg' }));
    expect(checkChosenFiles(eleven)).toEqual(['You chose 11 photos; send at most 10 at a time.']);
  });
});

interface Received {
  headers: IncomingMessage['headers'];
  body: string;
}
let server: Server;
let origin: string;
const received: Received[] = [];
let answer: { status: number; body: unknown } = { status: 201, body: {} };

beforeAll(async () => {
  server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      received.push({ headers: req.headers, body: Buffer.concat(chunks).toString('latin1') });
      res.writeHead(answer.status, { 'Content-Type': 'application/json' });
      res.end(JSON.stringify(answer.body));
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  // Same origin as the page, as in the app.
  (window as unknown as { happyDOM: { setURL(url: string): void } }).happyDOM.setURL(`${origin}/guilds/1/swaps/1`);
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));
afterEach(() => {
  cleanup();
  received.length = 0;
});

function choose(files: File[]) {
  const input = screen.getByLabelText('Choose photos') as HTMLInputElement;
  Object.defineProperty(input, 'files', { value: files, configurable: true });
  fireEvent.change(input);
}

describe('<PhotoUploader>', () => {
  it('lists chosen photos, leaves out files that are not photos with a reason, and lets one be removed', () => {
    render(<PhotoUploader uploadUrl="/api/blocks/1/photos" />);
    choose([jpeg('front.jpg'), jpeg('notes.exe', 10, 'application/x-msdownload'), jpeg('back.jpg', 3 * 1024 * 1024)]);
    const list = screen.getByRole('list', { name: 'Chosen photos' });
    expect(list.textContent).toContain('front.jpg');
    expect(list.textContent).toContain('back.jpg');
    expect(list.textContent).toContain('3.0 MB');
    expect(list.textContent).not.toContain('notes.exe');
    expect(screen.getByText('“notes.exe” is not a photo. Upload JPEG, PNG, WebP or HEIC pictures.')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Remove front.jpg' }));
    expect(screen.getByRole('button', { name: 'Upload 1 photo' })).toBeTruthy();
  });

  it('keeps the photos listed and shows the server’s reason when the upload is refused, then sends again', async () => {
    answer = {
      status: 415,
      body: { error: { code: 'not_a_photo', message: '“b.jpg” is not a photo. Upload JPEG, PNG or WebP pictures.' } },
    };
    const uploaded: unknown[] = [];
    render(<PhotoUploader uploadUrl="/api/blocks/7/photos" onUploaded={(r) => uploaded.push(r)} />);
    choose([jpeg('a.jpg'), jpeg('b.jpg')]);
    fireEvent.click(screen.getByRole('button', { name: 'Upload 2 photos' }));

    await screen.findByText('“b.jpg” is not a photo. Upload JPEG, PNG or WebP pictures.');
    expect(screen.getByRole('list', { name: 'Chosen photos' }).textContent).toContain('b.jpg');
    expect(received).toHaveLength(1);
    expect(received[0]!.headers['x-requested-with']).toBe('blockpost');
    expect(received[0]!.headers['content-type']).toMatch(/^multipart\/form-data; boundary=/);
    expect(received[0]!.body.match(/name="photos"; filename="(a|b)\.jpg"/g)).toHaveLength(2);

    fireEvent.click(screen.getByRole('button', { name: 'Remove b.jpg' }));
    answer = { status: 201, body: { photos: [{ id: 1 }], block: { id: 7, state: 'sewn' } } };
    fireEvent.click(screen.getByRole('button', { name: 'Try again' }));
    await screen.findByText('The photo was added.');
    expect(uploaded).toEqual([{ photos: [{ id: 1 }], block: { id: 7, state: 'sewn' } }]);
    expect(screen.queryByRole('list', { name: 'Chosen photos' })).toBeNull();
    await waitFor(() => expect(received).toHaveLength(2));
    expect(received[1]!.body).toContain('filename="a.jpg"');
    expect(received[1]!.body).not.toContain('filename="b.jpg"');
  });
});
