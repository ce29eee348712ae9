/** What any screen may see of a person: never the password hash. */
export function publicUser(u: typeof tables.users.$inferSelect) {
  return {
    id: u.id, email: u.email, name: u.name, role: u.role, phone: u.phone, active: u.active,
    onDuty: u.onDuty, lastLat: u.lastLat, lastLon: u.lastLon, lastPositionAt: u.lastPositionAt,
    homeTruckId: u.homeTruckId, version: u.version,
  }
}
