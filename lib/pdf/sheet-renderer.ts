import "server-only";
// Calc sheets to PDF: the server's own Chromium (Debian's, through playwright-core) opens the print-ready sheet
// page as the person who asked for the PDF — their session cookie is handed over for that one page, so the page
// checks who may read it as it always does — and prints it with the sheet's own @page rules (A4, "Page x of y").
//
// A sheet's *state* is the sha256 of its markup as Chromium laid it out: the same run shows a new state when a
// sign-off is added or its version is withdrawn, and the same state again otherwise. The caller keeps one PDF
// per state (lib/use-cases/files.ts), under the sheet key the page printed beside the sheet (data-sheet-key), and
// opens the sheet here only when no PDF is kept under the key of what the database holds now.
//
// One browser per server process, launched on first use and relaunched if it dies; at most two sheets are
// open at once (each page holds tens of MB), the rest wait their turn.
import { AsyncLocalStorage } from "node:async_hooks";
import { createHash } from "node:crypto";
import { chromium, type Browser } from "playwright-core";
import { AppError } from "@/lib/domain/errors";
import { appBaseUrl, serverEnv } from "@/lib/server-env";

const requestCookies = new AsyncLocalStorage<string>();

/** Runs `work` with the asking request's Cookie header at hand for the renderer. */
export function withRequestCookies<T>(cookieHeader: string | null, work: () => Promise<T>): Promise<T> {
  return requestCookies.run(cookieHeader ?? "", work);
}

let launched: Promise<Browser> | null = null;

function browser(): Promise<Browser> {
  if (!launched) {
    const args = ["--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update"];
    // Chromium's own sandbox cannot start as root (CI, containers); elsewhere it stays on.
    if (process.getuid?.() === 0) args.push("--no-sandbox");
    launched = chromium
      .launch({ executablePath: serverEnv().CHROMIUM_PATH, headless: true, args })
      .then((b) => {
        b.on("disconnected", () => {
          launched = null;
        });
        return b;
      })
      .catch((error: unknown) => {
        launched = null;
        throw new AppError(
          "unavailable",
          `The server cannot start Chromium to make PDFs (${serverEnv().CHROMIUM_PATH}): ${error instanceof Error ? error.message.split("\n")[0] : String(error)}. The print-ready sheet still prints from the browser.`,
        );
      });
  }
  return launched;
}

const MAX_OPEN = 2;
let open = 0;
const waiting: (() => void)[] = [];

async function takeTurn(): Promise<() => void> {
  if (open >= MAX_OPEN) await new Promise<void>((resolve) => waiting.push(resolve));
  open++;
  return () => {
    open--;
    waiting.shift()?.();
  };
}

/** "a=b; c=d" → cookies for Chromium, scoped to the address it loads the sheet from. */
function parseCookies(header: string, url: string): { name: string; value: string; url: string }[] {
  return header
    .split(";")
    .map((part) => part.trim())
    .filter((part) => part.includes("="))
    .map((part) => ({ name: part.slice(0, part.indexOf("=")), value: part.slice(part.indexOf("=") + 1), url }));
}

export type OpenSheet = {
  /** sha256 (hex) of the sheet's markup: what it shows now. */
  stateSha256: string;
  /** The key of the facts the page drew the sheet from, as it printed it (lib/use-cases/sheet-key.ts); null without one. */
  sheetKey: string | null;
  /** Prints the open sheet; the PDF's bytes and its page count. */
  print: () => Promise<{ body: Uint8Array; pages: number }>;
};

/** Pages in a PDF as Chromium writes it: one `/Type /Page` object per page (`/Pages` is the tree's root). */
export function countPdfPages(body: Uint8Array): number {
  return (
    Buffer.from(body)
      .toString("latin1")
      .match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []
  ).length;
}

let opened = 0;

/** How many sheets this process has opened in Chromium: a kept PDF served by its key opens none. */
export function sheetsOpened(): number {
  return opened;
}

/**
 * Opens a run's calc sheet in the server's Chromium as the asking person and hands it to `use` (which may
 * print it); the page is closed afterwards whatever happens.
 */
export async function withOpenSheet<T>(runId: string, use: (sheet: OpenSheet) => Promise<T>): Promise<T> {
  const cookieHeader = requestCookies.getStore();
  if (!cookieHeader) throw new AppError("unauthenticated", "Sign in to make a calc sheet PDF.");
  opened++;
  const base = (serverEnv().GUSSET_RENDER_URL ?? appBaseUrl()).replace(/\/+$/, "");
  const address = `${base}/runs/${encodeURIComponent(runId)}/sheet`;
  const release = await takeTurn();
  try {
    const context = await (await browser()).newContext({ viewport: { width: 1100, height: 1400 } });
    try {
      await context.addCookies(parseCookies(cookieHeader, base));
      const page = await context.newPage();
      const response = await page.goto(address, { waitUntil: "load", timeout: 30_000 });
      const status = response?.status() ?? 0;
      if (status === 404) throw new AppError("not-found", "There is no run with that id.");
      if (status === 403) throw new AppError("forbidden", "You may not read this run's calc sheet.");
      if (status !== 200 || new URL(page.url()).pathname !== new URL(address).pathname)
        throw new AppError("unavailable", `The calc sheet did not open for printing (status ${status}); try again.`);
      await page.evaluate(() => document.fonts.ready.then(() => undefined));
      const markup = await page.locator('[data-testid="calc-sheet"]').evaluate((element) => element.outerHTML);
      const stateSha256 = createHash("sha256").update(markup).digest("hex");
      const sheetKey = await page.evaluate(
        () => document.querySelector("[data-sheet-key]")?.getAttribute("data-sheet-key") ?? null,
      );
      return await use({
        stateSha256,
        sheetKey,
        print: async () => {
          await page.emulateMedia({ media: "print" });
          const body = new Uint8Array(await page.pdf({ preferCSSPageSize: true, printBackground: true }));
          return { body, pages: countPdfPages(body) };
        },
      });
    } finally {
      await context.close().catch(() => undefined);
    }
  } finally {
    release();
  }
}
