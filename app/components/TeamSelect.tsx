/** The labelled team picker of the forms that create a network in one of the caller's teams. */
export function TeamSelect({ id, teams }: { id: string; teams: { id: number; name: string }[] }) {
  return (
    <div>
      <label htmlFor={id} className="field-label">
        Team
      </label>
      <select id={id} name="teamId" className="input" defaultValue={teams[0].id}>
        {teams.map((team) => (
          <option key={team.id} value={team.id}>
            {team.name}
          </option>
        ))}
      </select>
    </div>
  );
}
