import { DEPARTMENT } from "@/lib/department";

// Plain-text notices written the way a department writes them: who, what, what to do next.
const signature = `\n\n${DEPARTMENT.division}\n${DEPARTMENT.city}\n${DEPARTMENT.address} · ${DEPARTMENT.phone}\n\nThis message was sent by Spanproof. Please do not reply to it.`;

export interface Mail {
  subject: string;
  text: string;
}

export function inviteMail(p: { name: string; roleLabel: string; link: string; invitedBy: string }): Mail {
  return {
    subject: `Your Spanproof account for ${DEPARTMENT.city}`,
    text:
      `Dear ${p.name},\n\n${p.invitedBy} has opened a Spanproof account for you as ${p.roleLabel} with the ` +
      `${DEPARTMENT.division}.\n\nChoose your password here (the link works once, for 7 days):\n${p.link}` +
      signature,
  };
}

export function resetMail(p: { name: string; link: string }): Mail {
  return {
    subject: "Reset your Spanproof password",
    text:
      `Dear ${p.name},\n\nSomeone asked to reset the password of your Spanproof account. If it was you, ` +
      `choose a new password here (the link works once, for 1 hour):\n${p.link}\n\nIf it was not you, ignore this message; ` +
      `your password stays as it is.` +
      signature,
  };
}

export { signature as mailSignature };
