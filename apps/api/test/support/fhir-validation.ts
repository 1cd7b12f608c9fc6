// FHIR validation for the tests: the `fhir` package's validator (R4 structure definitions and
// value sets), with one documented allowance (see validatorErrors).
import { createRequire } from 'node:module';
import { Fhir } from 'fhir';
import { CODE_SYSTEMS } from '../../src/records-out/fhir-bundle.js';

interface TypeProperty {
  _name: string;
  _type: string;
  _properties?: TypeProperty[];
  _valueSetStrength?: string;
}
const TYPES = createRequire(import.meta.url)('fhir/profiles/types.json') as Record<
  string,
  { _properties: TypeProperty[] }
>;

/** The binding strength of an element, from the validator's own R4 definitions ("Observation.component[0].code"). */
export function bindingStrength(location: string): string | undefined {
  const [root, ...path] = location.replace(/\[\d+\]/g, '').split('.');
  let props = TYPES[root]?._properties ?? [];
  let found: TypeProperty | undefined;
  for (const name of path) {
    found = props.find((p) => p._name === name);
    if (!found) return undefined;
    props = found._properties?.length ? found._properties : (TYPES[found._type]?._properties ?? []);
  }
  return found?._valueSetStrength;
}

/**
 * What the validator finds wrong. Its only allowance: a code of a documented code system in an
 * element whose R4 binding is not `required` (example and preferred bindings allow any code
 * system; this validator still notes each one it cannot find in the bound set as a warning).
 */
export function validatorErrors(resource: object) {
  const documented: string[] = Object.values(CODE_SYSTEMS);
  const result = new Fhir().validate(resource);
  return (result.messages ?? []).filter((m) => {
    const severity: string = m.severity ?? '';
    if (severity === 'error') return true;
    if (severity !== 'warning') return false;
    const message = m.message ?? '';
    const system = message.endsWith('not found in value set') ? /\((\S+)\)/.exec(message)?.[1] : undefined;
    const strength = bindingStrength(m.location ?? '');
    return !(system && documented.includes(system) && strength !== undefined && strength !== 'required');
  });
}
