// What a benchmark offers the runner: a name to select it by and a run that prints its figures.
export interface Bench {
  name: string;
  run(): unknown;
}
