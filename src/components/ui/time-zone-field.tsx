import { useId, useMemo } from 'react';
import { TextField } from './fields';

/** The zone the device runs in, such as "America/Chicago". */
export const deviceTimeZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;

/** Every IANA zone the browser knows, with UTC. */
function zoneNames(): string[] {
  const list = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  return list.includes('UTC') ? list : ['UTC', ...list];
}

type TimeZoneFieldProps = Omit<Parameters<typeof TextField>[0], 'list' | 'label'> & { label?: string };

/**
 * A time zone picked from the browser's list of IANA zones: typing part of a city or region narrows
 * the list ("chic" finds America/Chicago). The form starts it on the device's own zone.
 */
export function TimeZoneField({ label = 'Time zone', hint, ...rest }: TimeZoneFieldProps) {
  const listId = useId();
  const zones = useMemo(() => zoneNames(), []);
  return (
    <>
      <TextField
        label={label}
        hint={hint ?? `Type a city or region and pick from the list. This device is on ${deviceTimeZone().replace(/_/g, ' ')}.`}
        list={listId}
        autoComplete="off"
        spellCheck={false}
        maxLength={64}
        {...rest}
      />
      <datalist id={listId}>
        {zones.map((z) => (
          <option key={z} value={z}>
            {z.replace(/_/g, ' ')}
          </option>
        ))}
      </datalist>
    </>
  );
}
