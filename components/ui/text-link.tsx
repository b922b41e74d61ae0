import Link from "next/link";

export function TextLink({ href, children, testId }: { href: string; children: React.ReactNode; testId?: string }) {
  return (
    <Link href={href} className="text-plate-700 underline-offset-2 hover:underline" data-testid={testId}>
      {children}
    </Link>
  );
}
