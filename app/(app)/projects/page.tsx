import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readProjects } from "@/lib/use-cases/reads";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDate } from "@/components/format-date";

export const metadata: Metadata = { title: "Projects" };

export default async function ProjectsPage() {
  const actor = await requirePageActor("projects.read", { next: "/projects" });
  const projects = await runUseCase(readProjects, { actor, input: {} });

  return (
    <>
      <PageHeader
        title="Projects"
        lead="The firm's jobs, by job number. Runs of library templates are made inside a project, so that every calc sheet belongs to a job."
      />
      {projects.length === 0 ? (
        <EmptyState title="No projects yet">Projects appear here with their job numbers once they are set up.</EmptyState>
      ) : (
        <TableFrame testId="projects-table" headings={["Job number", "Project", "Client", "Set up"]}>
          {projects.map((project) => (
            <tr key={project.id} data-testid="project-row" data-job-number={project.jobNumber}>
              <td className="px-4 py-3 font-mono text-sm font-medium text-plate-800 tabular">{project.jobNumber}</td>
              <td className="px-4 py-3 text-ink-900">{project.name}</td>
              <td className="px-4 py-3 text-ink-700">{project.client ?? "—"}</td>
              <td className="px-4 py-3 text-ink-500 tabular">{formatDate(project.createdAt)}</td>
            </tr>
          ))}
        </TableFrame>
      )}
      <section className="mt-10">
        <EmptyState
          title="Coming to projects"
          testId="projects-coming"
          items={[
            "Setting up a project with its job number.",
            "The runs made in each project, with their calc sheets and sign-off.",
            "Files attached to a project's runs.",
          ]}
        />
      </section>
    </>
  );
}
