import { type Role } from '@kerfwright/contracts';

export interface RoleSummary {
  /** One line on where the role stands in the workshop. */
  summary: string;
  /** What the role does, in the order work usually happens. */
  duties: string[];
}

/** What each role does in the workshop, in plain words (see the roles table in the design notes). */
export const ROLE_DUTIES: Record<Role, RoleSummary> = {
  hobbyist: {
    summary: 'You are a member or customer: you bring the ideas and the workshop helps you cut them.',
    duties: [
      'Design a slotted sheet model, or start from a base solid in the catalogue.',
      'Scale it to the sheet stock you have and check it in the 3D and flat previews.',
      'Request a cut job, then follow it as the workshop prepares, approves and cuts it.',
    ],
  },
  fabricator: {
    summary: 'You turn requested designs into jobs the machines can cut.',
    duties: [
      'Keep the materials library and the kerf settings for each material up to date.',
      'Choose the material and kerf for every requested job.',
      'Prepare jobs: lay the pieces out on sheets and produce the cut pack.',
    ],
  },
  operator: {
    summary: 'You run the laser and the router for jobs that are released to the machines.',
    duties: [
      'See the jobs released for cutting.',
      'Read and acknowledge the safety notices before every cut.',
      'Download the cut pack and the setup sheet for the machine.',
      'Record each cut: the time it really took and the kerf you measured.',
    ],
  },
  supervisor: {
    summary: 'You are responsible for the workshop: its machines, its jobs, its people and its rules.',
    duties: [
      'Approve machine profiles and every new version of them.',
      'Approve jobs before they are released to the machines.',
      'Manage people and their roles.',
      "Keep the workshop's own safety rules current.",
    ],
  },
};
