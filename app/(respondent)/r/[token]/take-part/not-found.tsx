export default function RespondentNotFound() {
  return (
    <div className="flex flex-col gap-4 py-10 text-center">
      <h1 className="text-3xl">No study at this address</h1>
      <p className="text-lg">This link does not lead to a study. Check the address you were given.</p>
    </div>
  );
}
