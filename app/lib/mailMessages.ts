// The words of every message Kilostep sends, as plain text with a simple HTML twin. Pure: the
// senders hand in names, addresses and links; nothing here reads the database or the clock.
import { formatDateTime } from "./format.ts";

export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Paragraphs of text; a paragraph that is exactly a link becomes a button-like link in HTML. */
function compose(subject: string, paragraphs: string[]): MailContent {
  const html = paragraphs
    .map((p) =>
      /^https?:\/\/\S+$/.test(p)
        ? `<p><a href="${escapeHtml(p)}" style="color:#1d4f6e;font-weight:600">${escapeHtml(p)}</a></p>`
        : `<p>${escapeHtml(p).replace(/\n/g, "<br>")}</p>`,
    )
    .join("\n");
  return {
    subject,
    text: `${paragraphs.join("\n\n")}\n\n-- \nKilostep\n`,
    html: `<div style="font-family:Barlow,Arial,sans-serif;font-size:15px;line-height:1.5;color:#1f2a30">\n${html}\n<p style="color:#5b6770">Kilostep</p>\n</div>`,
  };
}

const ROLE_WORDS: Record<string, string> = {
  owner: "owner (everything, including members and sharing)",
  editor: "editor (change networks)",
  viewer: "viewer (read only)",
};

export function invitationMail(input: {
  teamName: string;
  inviterName: string;
  role: string;
  acceptUrl: string;
  expiresAt: string;
}): MailContent {
  return compose(`${input.inviterName} invites you to the team "${input.teamName}" on Kilostep`, [
    `${input.inviterName} invites you to join the team "${input.teamName}" on Kilostep as ${ROLE_WORDS[input.role] ?? input.role}.`,
    "Open this link to accept. If you have no Kilostep account yet, you can create one there:",
    input.acceptUrl,
    `The link works once and until ${formatDateTime(input.expiresAt)}. If you did not expect this, ignore this message.`,
  ]);
}

export function passwordResetMail(input: { name: string; resetUrl: string; validMinutes: number }): MailContent {
  return compose("Choose a new Kilostep password", [
    `Hello ${input.name},`,
    "Someone (we hope you) asked to choose a new password for this Kilostep account. Open this link to choose one:",
    input.resetUrl,
    `The link works once, for ${input.validMinutes} minutes. Choosing a new password signs this account out everywhere else.`,
    "If you did not ask for this, ignore this message: your password stays as it is.",
  ]);
}

export function reviewRequestMail(input: {
  networkName: string;
  fromName: string;
  role: "viewer" | "editor";
  url: string;
  expiresAt: string | null;
  message: string;
}): MailContent {
  const access =
    input.role === "editor"
      ? "The link lets you change this network (you will be asked to sign in or create an account)."
      : "The link opens the network read only; you need no account to read it, and one only to write review notes.";
  const paragraphs = [
    `${input.fromName} asks you to please review the network "${input.networkName}" on Kilostep.`,
    ...(input.message.trim() ? [`Their note: ${input.message.trim()}`] : []),
    input.url,
    access,
    input.expiresAt ? `The link works until ${formatDateTime(input.expiresAt)}.` : "The link works until it is revoked.",
  ];
  return compose(`Please review "${input.networkName}"`, paragraphs);
}

export function reviewNoteMail(input: {
  networkName: string;
  authorName: string;
  pinnedTo: string;
  body: string;
  reply: boolean;
  url: string;
}): MailContent {
  const what = input.reply ? "replied to a review note" : "wrote a review note";
  return compose(`${input.authorName} ${what} on "${input.networkName}"`, [
    `${input.authorName} ${what} on ${input.pinnedTo} of "${input.networkName}":`,
    input.body,
    input.url,
    "You get these because you own this network's team. Turn them off on your account page.",
  ]);
}

export function emailVerificationMail(input: { name: string; verifyUrl: string; validDays: number }): MailContent {
  return compose("Confirm your e-mail address for Kilostep", [
    `Hello ${input.name},`,
    "Open this link to confirm that this address is yours. Team owners can then add you to their teams by it:",
    input.verifyUrl,
    `The link works once, for ${input.validDays} days. If you did not make a Kilostep account, ignore this message.`,
  ]);
}
