/** The labelled team picker of the forms that create a network in one of the caller's teams. */
export function TeamSelect({
  id,
  teams,
  onChange,
}: {
  id: string;
  teams: { id: number; name: string }[];
  /** Told the chosen team's id, for forms whose advice depends on the team. */
  onChange?: (teamId: number) => void;
}) {
  return (
    <div>
      <label htmlFor={id} className="field-label">
        Team
      </label>
      <select id={id} name="teamId" className="input" defaultValue={teams[0].id} onChange={(event) => onChange?.(Number(event.target.value))}>
        {teams.map((team) => (
          <option key={team.id} value={team.id}>
            {team.name}
          </option>
        ))}
      </select>
    </div>
  );
}
