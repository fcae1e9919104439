/**
 * The manifest for a deployment: every `https://localhost:3000/` address of
 * manifest.xml (the development server) moved to the address the built files
 * will be served from.
 *
 * Excel loads an add-in's pages, scripts, metadata and icons over https only
 * (Microsoft, "Office Add-ins XML manifest": SourceLocation and the bt:Url
 * and bt:Image resources must be https), so the deployment address must be
 * an absolute https URL; it is given as the folder holding the built files.
 *
 * Cost: one pass over the manifest text.
 */

/** The address every URL of the development manifest starts with. */
export const DEVELOPMENT_ORIGIN = "https://localhost:3000/";

/**
 * The deployment folder as a normalised base URL (ending in "/"), or a
 * message saying why the text cannot be one.
 *
 * @example
 * deploymentBase("https://addins.example.org/evensplit"); // { base: "https://addins.example.org/evensplit/" }
 * deploymentBase("http://addins.example.org/");            // { problem: "... must use https ..." }
 */
export function deploymentBase(text: string): { base: string } | { problem: string } {
  let url: URL;
  try {
    url = new URL(text.trim());
  } catch {
    return {
      problem: `"${text}" is not an absolute URL; give the https address the built files will be served from, such as https://addins.example.org/evensplit/.`,
    };
  }
  if (url.protocol !== "https:") return { problem: `${url.href} must use https: Excel loads add-ins over https only.` };
  if (url.search || url.hash) return { problem: `${url.href} must be a folder address without a query or fragment.` };
  if (url.username || url.password) return { problem: `${url.href} must not carry a user name or password.` };
  const base = url.href.endsWith("/") ? url.href : `${url.href}/`;
  return { base };
}

/**
 * The manifest text with the development origin replaced by `base`; throws
 * when the manifest still names localhost anywhere afterwards (an address
 * that was not written the expected way).
 *
 * @example
 * manifestForDeployment('<IconUrl DefaultValue="https://localhost:3000/assets/icon-32.png"/>', "https://example.org/es/");
 * // '<IconUrl DefaultValue="https://example.org/es/assets/icon-32.png"/>'
 */
export function manifestForDeployment(manifest: string, base: string): string {
  const moved = manifest.split(DEVELOPMENT_ORIGIN).join(base);
  const left = /localhost/i.exec(moved);
  if (left)
    throw new Error(
      `manifest.xml still names localhost after moving its addresses (near "${moved.slice(Math.max(0, left.index - 40), left.index + 30)}").`,
    );
  return moved;
}

/**
 * functions.json with every help page address (helpUrl) moved from the
 * development origin to `base`, as the manifest's addresses are; other
 * fields are kept. Throws when a helpUrl names neither (an address written
 * another way would be left pointing at nothing).
 *
 * @example
 * metadataForDeployment('{"functions":[{"id":"PVALUE","helpUrl":"https://localhost:3000/help/pvalue.html"}]}', "https://example.org/es/");
 * // '{"functions":[{"id":"PVALUE","helpUrl":"https://example.org/es/help/pvalue.html"}]}' (indented)
 */
export function metadataForDeployment(metadataJson: string, base: string): string {
  const metadata = JSON.parse(metadataJson) as { functions: { id: string; helpUrl?: string }[] };
  const functions = metadata.functions.map((fn) => {
    if (fn.helpUrl === undefined) return fn;
    if (!fn.helpUrl.startsWith(DEVELOPMENT_ORIGIN))
      throw new Error(`The helpUrl of ${fn.id} (${fn.helpUrl}) is not on ${DEVELOPMENT_ORIGIN}; it cannot be moved.`);
    return { ...fn, helpUrl: base + fn.helpUrl.slice(DEVELOPMENT_ORIGIN.length) };
  });
  return JSON.stringify({ ...metadata, functions }, null, 4);
}
