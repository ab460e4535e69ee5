// The helpers live with the mail that carries the links, so the mail jobs can make tokens too.
export { hashToken, newToken } from '../mail/link-tokens';
