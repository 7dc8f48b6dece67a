import { Card, PageTitle } from '@client/components/ui/card';
import { AddAdminForm, PeopleTable } from '@client/features/admin';
import { useMe } from '@client/features/auth';

export function AdminPeopleRoute() {
  const { data: me } = useMe();
  return (
    <div>
      <PageTitle title="People" lead="Every account on Tenthmark. Suspend an account that breaks the rules, and reinstate it later; new administrators are added here, by an administrator." />
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[2fr_1fr]">
        <Card>
          <PeopleTable currentUserId={me?.id} />
        </Card>
        <Card>
          <h2 className="mb-4 text-xl font-bold">Add an administrator</h2>
          <AddAdminForm />
        </Card>
      </div>
    </div>
  );
}
