import { ink } from "../palette";

interface DotProps<P> {
  cx?: number;
  cy?: number;
  index?: number;
  payload?: P;
}

/**
 * A line's `dot` renderer that marks only the named points (boards, junctions, nodes)
 * with a ring; the line itself carries the other points.
 */
export function namedPointDot<P>(isNamed: (payload: P | undefined) => boolean) {
  function NamedPointDot({ cx, cy, index, payload }: DotProps<P>) {
    return isNamed(payload) && cx !== undefined && cy !== undefined ? (
      <circle key={`d${index}`} cx={cx} cy={cy} r={3.5} fill={ink.paper} stroke={ink.series} strokeWidth={2} />
    ) : (
      <g key={`d${index}`} />
    );
  }
  return NamedPointDot;
}
