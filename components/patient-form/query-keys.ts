// TanStack Query keys for the registration form's directory look-ups.
export const gpPracticeKeys = {
  all: ["gp-practices"] as const,
  directory: () => [...gpPracticeKeys.all, "directory"] as const,
};
