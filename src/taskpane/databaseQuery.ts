/**
 * The SQL for data that live in a database: the README's two queries (one
 * column; one GROUP BY for many groups), kept here as the one copy that the
 * README quotes, the DuckDB tests run and the pane fills in.
 *
 * Method: the README's texts read three tables, `measurements`,
 * `median_question` and (grouped) `group_ranks`. The pane's query puts the
 * person's table and columns, the hypothesised median and the ranks in front
 * of that text as common table expressions of those names, so the text that
 * does the counting is the README's own, character for character. The ranks
 * depend on n, which only the data know: the first query carries no ranks
 * (its bounds come back empty) and tells n; the second carries the ranks
 * ORDERRANKS gives for that n. Names are written unquoted when they are plain
 * (letters, digits, underscore; not a reserved word), so the engine folds
 * their case as it does for the person's own queries; any other name is
 * quoted with double quotes, a double quote inside it doubled (SQL:2003,
 * delimited identifiers), so no name can end the quotes early; a name with a
 * control character (a line break among them) is refused. The hypothesised
 * value is written as a numeric literal, never as text.
 *
 * Cost: O(length of the names and of the rank list).
 */

/** The README's query for one column (the text between its ```sql fences). */
export const ONE_COLUMN_SQL = `-- Evensplit: the sign-test counts against a hypothesised median and two order statistics, for one column.
-- Reads measurements(measurement) and the one-row table median_question(hypothesised_median, lower_rank,
-- upper_rank); the ranks are those EVENSPLIT.ORDERRANKS gives for n, the number of values (this query's n).
WITH ordered AS (
  SELECT m.measurement AS x,
         ROW_NUMBER() OVER (ORDER BY m.measurement) AS order_rank
  FROM measurements m
  WHERE m.measurement IS NOT NULL
)
SELECT COUNT(*) AS n,
       SUM(CASE WHEN o.x < q.hypothesised_median THEN 1 ELSE 0 END) AS below,
       SUM(CASE WHEN o.x = q.hypothesised_median THEN 1 ELSE 0 END) AS tied,
       SUM(CASE WHEN o.x > q.hypothesised_median THEN 1 ELSE 0 END) AS above,
       MIN(CASE WHEN o.order_rank = q.lower_rank THEN o.x END) AS lower_bound,
       MIN(CASE WHEN o.order_rank = q.upper_rank THEN o.x END) AS upper_bound
FROM ordered o
CROSS JOIN median_question q
`;

/** The README's query for many groups in one GROUP BY. */
export const BY_GROUP_SQL = `-- Evensplit: the same for every group at once, in one GROUP BY.
-- Reads measurements(group_label, measurement), the one-row table median_question(hypothesised_median) and
-- group_ranks(group_label, lower_rank, upper_rank): one row per group, ORDERRANKS of that group's n.
WITH ordered AS (
  SELECT m.group_label,
         m.measurement AS x,
         ROW_NUMBER() OVER (PARTITION BY m.group_label ORDER BY m.measurement) AS order_rank
  FROM measurements m
  WHERE m.measurement IS NOT NULL
)
SELECT o.group_label,
       COUNT(*) AS n,
       SUM(CASE WHEN o.x < q.hypothesised_median THEN 1 ELSE 0 END) AS below,
       SUM(CASE WHEN o.x = q.hypothesised_median THEN 1 ELSE 0 END) AS tied,
       SUM(CASE WHEN o.x > q.hypothesised_median THEN 1 ELSE 0 END) AS above,
       MIN(CASE WHEN o.order_rank = r.lower_rank THEN o.x END) AS lower_bound,
       MIN(CASE WHEN o.order_rank = r.upper_rank THEN o.x END) AS upper_bound
FROM ordered o
CROSS JOIN median_question q
LEFT JOIN group_ranks r ON r.group_label = o.group_label
GROUP BY o.group_label
ORDER BY o.group_label
`;

/** The columns a result row of the one-column query holds, in order (the grouped one has the label first). */
export const RESULT_COLUMNS = ["n", "below", "tied", "above", "lower_bound", "upper_bound"] as const;

/** Ranks of the two order statistics; null for an end not asked for (a one-sided bound). */
export interface OrderRanks {
  readonly lower: number | null;
  readonly upper: number | null;
}

/** One group's ranks, by its label as the first query returned it (text, a number, or null for a NULL label). */
export interface GroupRanks extends OrderRanks {
  readonly label: string | number | null;
}

/** What the person named: where the values are, and the median under test. */
export interface DatabaseQuestion {
  /** A table or view, optionally qualified (`schema.table`): each part between dots is one name. */
  readonly table: string;
  readonly column: string;
  /** A column whose values label groups; absent for one column. */
  readonly group?: string;
  readonly center: number;
}

/** A name that can go into the query, or why not. */
export type NameRead = { readonly ok: true; readonly sql: string } | { readonly ok: false; readonly message: string };

const PLAIN_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;
// eslint-disable-next-line no-control-regex -- control characters are exactly what this refuses
const CONTROL = /[\u0000-\u001f\u007f]/;

/**
 * Words reserved in SQL:2003 (ISO/IEC 9075-2, 5.2) that are likely as table or column names, or that
 * the query itself uses; such a name is quoted, as an unquoted one would be read as the keyword.
 */
const RESERVED = new Set(
  (
    "all and any as asc between both by case cast check column create cross current date day default delete desc " +
    "distinct else end except exists false fetch for from full group having hour in inner insert intersect interval " +
    "into is join leading left like limit minute month natural not null of on only or order outer over partition " +
    "primary range references right row rows second select set some table then time timestamp to trailing true union " +
    "unique update user using value values when where window with year"
  ).split(" "),
);

/**
 * One name for the query: as typed when it is plain, else between double quotes with any double quote doubled.
 *
 * @example
 * sqlName("thickness", "The column");      // { ok: true, sql: "thickness" }
 * sqlName('Thick"ness µm', "The column");  // { ok: true, sql: '"Thick""ness µm"' }
 * sqlName("order", "The column");          // { ok: true, sql: '"order"' }
 */
export function sqlName(name: string, what: string): NameRead {
  if (name === "") return { ok: false, message: `${what} is empty: type its name as the database knows it.` };
  if (CONTROL.test(name)) return { ok: false, message: `${what} holds a line break or another control character; type the name alone.` };
  if (name.trim() !== name) return { ok: false, message: `${what} starts or ends with a space; type the name without it.` };
  if (PLAIN_NAME.test(name) && !RESERVED.has(name.toLowerCase())) return { ok: true, sql: name };
  return { ok: true, sql: `"${name.replace(/"/g, '""')}"` };
}

/**
 * A table's name for the query: each part between dots a name of its own (schema.table).
 *
 * @example
 * sqlTableName("plant.panels"); // { ok: true, sql: "plant.panels" }
 * sqlTableName("plant..panels"); // { ok: false, message: "The table name has an empty part ..." }
 */
export function sqlTableName(table: string): NameRead {
  const trimmed = table.trim();
  if (trimmed === "")
    return { ok: false, message: "The table is empty: type its name as the database knows it (schema.table if need be)." };
  const parts = trimmed.split(".").map((part) => sqlName(part, "The table name"));
  if (trimmed.split(".").some((part) => part === ""))
    return { ok: false, message: "The table name has an empty part between dots; type it as table or schema.table." };
  const problem = parts.find((part) => !part.ok);
  if (problem) return problem;
  return { ok: true, sql: parts.map((part) => (part.ok ? part.sql : "")).join(".") };
}

/**
 * A finite number as an SQL numeric literal: the shortest digits that read back as the same double, an
 * exponent written with E (an approximate numeric literal, SQL:2003 5.3).
 *
 * @example
 * sqlNumber(50.5);  // "50.5"
 * sqlNumber(1e-7);  // "1E-7"
 */
export function sqlNumber(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError("an SQL numeric literal must be a finite number");
  return String(x).replace("e", "E").replace("E+", "E");
}

/** A rank as a literal: a whole number, or a typed NULL for an end not asked for. */
function rankLiteral(rank: number | null): string {
  if (rank === null) return "CAST(NULL AS INTEGER)";
  if (!Number.isInteger(rank) || rank < 1) throw new RangeError("a rank is a whole number of 1 or more");
  return String(rank);
}

/** A group label as the literal that matches it: a number as a number, text as a string, NULL as NULL. */
function labelLiteral(label: string | number | null): string {
  if (label === null) return "NULL";
  if (typeof label === "number") return sqlNumber(label);
  return `'${label.replace(/'/g, "''")}'`;
}

/** The README text without its opening comment lines, from its WITH on. */
function templateBody(template: string): string {
  const body = template.replace(/^(?:--[^\n]*\n)+/, "");
  if (!body.startsWith("WITH ")) throw new Error("the query template must start with WITH after its comments");
  return body.slice("WITH ".length);
}

/** The names checked and written for the query, or the first problem. */
export type QuestionRead =
  | { readonly ok: true; readonly table: string; readonly column: string; readonly group: string | null }
  | { readonly ok: false; readonly message: string };

/**
 * The table, column and group column as they will appear in the query.
 *
 * @example
 * readNames({ table: "panels", column: "Thickness (µm)", center: 50 }); // { ok: true, table: "panels", column: '"Thickness (µm)"', group: null }
 */
export function readNames(question: DatabaseQuestion): QuestionRead {
  const table = sqlTableName(question.table);
  if (!table.ok) return table;
  const column = sqlName(question.column.trim(), "The column");
  if (!column.ok) return column;
  if (question.group === undefined || question.group.trim() === "") return { ok: true, table: table.sql, column: column.sql, group: null };
  const group = sqlName(question.group.trim(), "The group column");
  if (!group.ok) return group;
  return { ok: true, table: table.sql, column: column.sql, group: group.sql };
}

/**
 * The query to run: the README's text with the person's table, column, group column, hypothesised median and
 * ranks in front of it. Without ranks (the first run) the bounds come back empty and the rows tell n; with
 * them, the bounds are the values at those ranks. For groups, `ranks` lists one entry per group label (a
 * group left out gets empty bounds). Throws on names `readNames` refuses.
 *
 * @example
 * databaseQuery({ table: "panels", column: "thickness", center: 50 }, { lower: 10, upper: 21 });
 * // "-- Evensplit, second run: ...\nWITH measurements AS (\n  SELECT thickness AS measurement\n  FROM panels\n),\n..."
 */
export function databaseQuery(question: DatabaseQuestion, ranks: OrderRanks | readonly GroupRanks[] | null): string {
  const names = readNames(question);
  if (!names.ok) throw new RangeError(names.message);
  const grouped = names.group !== null;
  const run =
    ranks === null
      ? "-- Evensplit, first run: the counts and each n (the bounds come back empty until the second run carries the ranks).\n"
      : "-- Evensplit, second run: the counts and the bounds at the ranks EVENSPLIT.ORDERRANKS gives for n.\n";
  const measured = grouped
    ? `  SELECT ${names.group} AS group_label, ${names.column} AS measurement\n  FROM ${names.table}`
    : `  SELECT ${names.column} AS measurement\n  FROM ${names.table}`;
  const ctes = [`measurements AS (\n${measured}\n)`];
  const center = sqlNumber(question.center);
  if (!grouped) {
    const one = ranks === null || Array.isArray(ranks) ? { lower: null, upper: null } : (ranks as OrderRanks);
    ctes.push(
      `median_question AS (\n  SELECT ${center} AS hypothesised_median, ${rankLiteral(one.lower)} AS lower_rank, ${rankLiteral(one.upper)} AS upper_rank\n)`,
    );
    return `${run}WITH ${ctes.join(",\n")},\n${templateBody(ONE_COLUMN_SQL)}`;
  }
  ctes.push(`median_question AS (\n  SELECT ${center} AS hypothesised_median\n)`);
  // A NULL label matches nothing in the join, so it needs no ranks.
  const list = (Array.isArray(ranks) ? (ranks as readonly GroupRanks[]) : []).filter((g) => g.label !== null);
  // With no ranks yet, an empty table whose label column has the group column's own type (so the join compares like with like).
  const groupRanks =
    list.length === 0
      ? "  SELECT m.group_label, CAST(NULL AS INTEGER) AS lower_rank, CAST(NULL AS INTEGER) AS upper_rank\n  FROM measurements m\n  WHERE 1 = 0"
      : list
          .map(
            (g) =>
              `  SELECT ${labelLiteral(g.label)} AS group_label, ${rankLiteral(g.lower)} AS lower_rank, ${rankLiteral(g.upper)} AS upper_rank`,
          )
          .join("\n  UNION ALL\n");
  ctes.push(`group_ranks AS (\n${groupRanks}\n)`);
  return `${run}WITH ${ctes.join(",\n")},\n${templateBody(BY_GROUP_SQL)}`;
}
