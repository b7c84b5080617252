/** The floor's links on the foreman's and the floor staff's homes: big targets for a tablet. */
import { Link } from 'react-router';
import { buttonClass } from '../../components/Button';
import { Panel } from '../../components/Panel';
import { useCurrentUser } from '../../lib/session';

export function FloorHomePanel() {
  const { role } = useCurrentUser();
  const links =
    role === 'foreman'
      ? [
          { to: '/board', label: 'Board' },
          { to: '/load', label: 'Load' },
          { to: '/my-work', label: 'My work' },
          { to: '/scan', label: 'Scan station' },
        ]
      : [
          { to: '/my-work', label: 'My work' },
          { to: '/scan', label: 'Scan station' },
          { to: '/board', label: 'Board' },
        ];
  return (
    <Panel title="The floor">
      <div className="grid grid-cols-2 gap-3">
        {links.map((l, i) => (
          <Link key={l.to} to={l.to} className={buttonClass(i === 0 ? 'primary' : 'secondary', 'lg', 'h-16 text-lg')}>
            {l.label}
          </Link>
        ))}
      </div>
    </Panel>
  );
}
